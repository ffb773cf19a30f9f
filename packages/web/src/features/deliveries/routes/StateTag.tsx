import { type IconName, Intent, Tag } from '@blueprintjs/core';
import type { OutboxState } from '../../../lib/api/types';

/** A message's state: its word and an icon as well as a colour. */
export const stateLook: Record<OutboxState, { label: string; icon: IconName; intent: Intent }> = {
  sent: { label: 'Sent', icon: 'tick', intent: Intent.SUCCESS },
  queued: { label: 'Queued', icon: 'time', intent: Intent.NONE },
  sending: { label: 'Sending', icon: 'send-message', intent: Intent.PRIMARY },
  failed: { label: 'Failed', icon: 'error', intent: Intent.DANGER },
};

export function StateTag({ state, count }: { state: OutboxState; count?: number }) {
  const look = stateLook[state];
  return (
    <Tag minimal intent={look.intent} icon={look.icon}>
      {count === undefined ? look.label : `${look.label} ${count}`}
    </Tag>
  );
}
