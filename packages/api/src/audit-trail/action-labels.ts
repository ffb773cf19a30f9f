/**
 * The words for each action the audit trail records, in one place: the API
 * sends them with every event and with the list of actions, and the web shows
 * them (the dotted action name stays available for support and filtering).
 */
export const ACTION_LABELS: Record<string, string> = {
  'auth.sign_in': 'Signed in',
  'auth.sign_in_refused': 'Sign-in refused',
  'auth.sign_out': 'Signed out',
  'auth.session_ended': 'Session ended',
  'user.created': 'Person added',
  'user.provisioned': 'Person added at first sign-in',
  'user.renamed': 'Name changed',
  'user.role_changed': 'Role changed',
  'user.deactivated': 'Person deactivated',
  'user.reactivated': 'Person reactivated',
  'user.mail_preferences_changed': 'Mail preferences changed',
  'membership.added': 'Practice assigned',
  'membership.removed': 'Practice unassigned',
  'region.created': 'Region created',
  'quarter.opened': 'Audit quarter opened',
  'quarter.closed': 'Audit quarter closed',
  'quarter.reopened': 'Audit quarter reopened',
  'quarter.deadline_changed': 'Submission deadline changed',
  'quarter.measure_set_changed': 'Measure set of a quarter changed',
  'measure_set.draft_started': 'Measure-set draft started',
  'measure_set.draft_saved': 'Measure-set draft saved',
  'measure_set.draft_discarded': 'Measure-set draft discarded',
  'measure_set.published': 'Measure set published',
  'report.published': 'Report published',
  'report.withdrawn': 'Report withdrawn',
  'review_case.opened': 'Review case opened',
  'review_case.asked': 'Question sent to the practice',
  'review_case.answered': 'Practice answered',
  'review_case.file_added': 'File attached to a review case',
  'review_case.commented': 'Comment added to a review case',
  'review_case.noted': 'Internal note added to a review case',
  'review_case.closed': 'Review case closed',
  'review_case.reopened': 'Review case reopened',
  'mail.queued': 'E-mail queued',
  'mail.resent': 'Failed e-mail sent again',
  'mail.digest_test_sent': 'Test digest sent',
  'mail.digests_scheduled': 'Digests scheduled',
  'mail.digests_unscheduled': 'Digests unscheduled',
  'mail_recipient.added': 'Mail recipient added',
  'mail_recipient.removed': 'Mail recipient removed',
  'submission.uploaded': 'Extract uploaded',
  'submission.identical_refused': 'Upload refused: same file again',
  'submission.validated': 'Extract checked',
  'submission.rejected': 'Extract refused',
  'submission.failed': 'Check failed',
  'submission.retried': 'Check started again',
  'submission.confirmed': 'Submission confirmed',
  'submission.cancelled': 'Submission cancelled',
  'demo.seeded': 'Demo data loaded',
};

/** The groups of actions the trail can be filtered by (a prefix ending in "."). */
export const ACTION_GROUP_LABELS: Record<string, string> = {
  'auth.': 'Sign-ins and sign-outs',
  'user.': 'Changes to people',
  'membership.': 'Practice assignments',
  'quarter.': 'Audit quarters',
  'submission.': 'Extracts and submissions',
  'measure_set.': 'Measure sets',
  'report.': 'Reports',
  'review_case.': 'Review cases',
  'mail.': 'E-mail',
  'mail_recipient.': 'Mail recipients',
};

/** An action in words; an action Cairn has no words for yet is shown as "Other: <its name>". */
export function actionLabel(action: string): string {
  return ACTION_LABELS[action] ?? `Other: ${action.replace(/[._]/g, ' ')}`;
}
