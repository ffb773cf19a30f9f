/**
 * The kinds of e-mail Cairn sends, with what a person reads about each on
 * their profile (where they may choose not to receive it). A module that sends
 * a new kind adds it here and registers its composer (MailComposers).
 */
import type { Role } from '../users/roles.js';

export const MAIL_KINDS = [
  'quarter_opened',
  'deadline_reminder',
  'review_case_question',
  'digest',
] as const;
export type MailKind = (typeof MAIL_KINDS)[number];

export interface MailKindInfo {
  label: string;
  /** What the message says and when it is sent */
  description: string;
  /** Who receives it */
  sentTo: readonly Role[];
  /** How the delivery page names a source's messages: "2026 Q4 opening message" */
  sourceNoun: string;
}

export const MAIL_KIND_INFO: Record<MailKind, MailKindInfo> = {
  quarter_opened: {
    label: 'Audit quarter opened',
    description:
      'When the regional lead opens an audit quarter: its submission deadline and the link to the extract template.',
    sentTo: ['practice_lead'],
    sourceNoun: 'opening message',
  },
  deadline_reminder: {
    label: 'Submission deadline reminders',
    description:
      'Before a submission deadline, when your practice has no current submission for that audit quarter. Once per practice and quarter.',
    sentTo: ['practice_lead'],
    sourceNoun: 'deadline reminders',
  },
  // ── review cases ──
  review_case_question: {
    label: 'Review case questions',
    description:
      'When an auditor asks your practice a question in a review case. The message says where to answer in Cairn.',
    sentTo: ['practice_lead'],
    sourceNoun: 'question',
  },
  digest: {
    label: 'Quarterly digests',
    description:
      "When the regional lead sends a quarter's report: where your practice stands against the region, what changed, where improvement would matter most, with the practice's figures attached.",
    sentTo: ['practice_lead'],
    sourceNoun: 'digests',
  },
};

export const isMailKind = (value: unknown): value is MailKind =>
  typeof value === 'string' && (MAIL_KINDS as readonly string[]).includes(value);

/** "Audit quarter opened and Submission deadline reminders" */
export function describeKinds(kinds: readonly string[]): string {
  const labels = kinds.filter(isMailKind).map((k) => MAIL_KIND_INFO[k].label.toLowerCase());
  if (labels.length <= 1) return labels.join('');
  return `${labels.slice(0, -1).join(', ')} and ${labels[labels.length - 1]}`;
}
