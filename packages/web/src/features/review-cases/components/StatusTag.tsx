import { Icon, Tag } from '@blueprintjs/core';
import type { IconName } from '@blueprintjs/icons';
import type { CaseStatus } from '../../../lib/api/types';

/** A case's state: an icon and the words, never colour alone. */
const ICONS: Record<CaseStatus, IconName> = {
  open: 'folder-open',
  awaiting_practice: 'time',
  responded: 'comment',
  closed: 'tick-circle',
};

export function StatusTag({ status, label }: { status: CaseStatus; label: string }) {
  return (
    <Tag minimal className={`cairn-case-status cairn-case-${status}`}>
      <Icon icon={ICONS[status]} size={12} /> {label}
    </Tag>
  );
}
