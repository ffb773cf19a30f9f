import { type IconName, Intent, Tag } from '@blueprintjs/core';
import type { CoverageState, IssueSeverity, SubmissionStatus } from '../../../lib/api/types';

/** Each status in words and with an icon: never colour alone. */
export const statusLook: Record<
  SubmissionStatus,
  { label: string; icon: IconName; intent: Intent; meaning: string }
> = {
  processing: {
    label: 'Processing',
    icon: 'refresh',
    intent: Intent.PRIMARY,
    meaning: 'Cairn is checking the extract.',
  },
  rejected: {
    label: 'Rejected',
    icon: 'ban-circle',
    intent: Intent.DANGER,
    meaning: 'The file was refused as a whole; nothing from it is used.',
  },
  awaiting_confirmation: {
    label: 'Awaiting confirmation',
    icon: 'time',
    intent: Intent.WARNING,
    meaning: 'Checked; it is used only once someone confirms it.',
  },
  accepted: {
    label: 'Accepted',
    icon: 'tick-circle',
    intent: Intent.SUCCESS,
    meaning: 'Confirmed: its records are used for the audit quarter.',
  },
  superseded: {
    label: 'Superseded',
    icon: 'history',
    intent: Intent.NONE,
    meaning: 'Replaced by a later confirmed submission.',
  },
  cancelled: {
    label: 'Cancelled',
    icon: 'disable',
    intent: Intent.NONE,
    meaning: 'Cancelled; nothing from it is used.',
  },
  failed: {
    label: 'Failed',
    icon: 'error',
    intent: Intent.DANGER,
    meaning: 'Cairn could not finish checking it.',
  },
};

export function StatusTag({ status, large }: { status: SubmissionStatus; large?: boolean }) {
  const look = statusLook[status];
  return (
    <Tag
      minimal
      size={large ? 'large' : undefined}
      intent={look.intent}
      icon={look.icon}
      htmlTitle={look.meaning}
      className="cairn-status-tag"
    >
      {look.label}
    </Tag>
  );
}

export function CurrentTag() {
  return (
    <Tag
      minimal
      intent={Intent.SUCCESS}
      icon="endorsed"
      htmlTitle="The submission used for this audit quarter"
    >
      Current
    </Tag>
  );
}

export const severityLook: Record<
  IssueSeverity,
  { label: string; plural: string; icon: IconName; intent: Intent }
> = {
  refusal: { label: 'Refusal', plural: 'Refusals', icon: 'ban-circle', intent: Intent.DANGER },
  error: {
    label: 'Row refused',
    plural: 'Row errors',
    icon: 'cross-circle',
    intent: Intent.DANGER,
  },
  warning: { label: 'Warning', plural: 'Warnings', icon: 'warning-sign', intent: Intent.WARNING },
  flag: {
    label: 'Data-quality flag',
    plural: 'Data-quality flags',
    icon: 'flag',
    intent: Intent.PRIMARY,
  },
};

export function SeverityTag({ severity }: { severity: IssueSeverity }) {
  const look = severityLook[severity];
  return (
    <Tag minimal intent={look.intent} icon={look.icon}>
      {look.label}
    </Tag>
  );
}

export const coverageLook: Record<
  CoverageState,
  { label: string; icon: IconName; intent: Intent }
> = {
  current: { label: 'Current submission', icon: 'tick-circle', intent: Intent.SUCCESS },
  awaiting_confirmation: { label: 'Awaiting confirmation', icon: 'time', intent: Intent.WARNING },
  none: { label: 'No submission', icon: 'circle', intent: Intent.NONE },
};

export function CoverageTag({ state }: { state: CoverageState }) {
  const look = coverageLook[state];
  return (
    <Tag minimal intent={look.intent} icon={look.icon}>
      {look.label}
    </Tag>
  );
}
