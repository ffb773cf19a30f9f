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
  'membership.added': 'Practice assigned',
  'membership.removed': 'Practice unassigned',
  'region.created': 'Region created',
  'quarter.opened': 'Audit quarter opened',
  'quarter.closed': 'Audit quarter closed',
  'quarter.reopened': 'Audit quarter reopened',
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
};

/** An action in words; an action Cairn has no words for yet is shown as "Other: <its name>". */
export function actionLabel(action: string): string {
  return ACTION_LABELS[action] ?? `Other: ${action.replace(/[._]/g, ' ')}`;
}
