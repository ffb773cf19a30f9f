import { Intent, Tag } from '@blueprintjs/core';
import type { QuarterStatus } from '../../../lib/api/types';

/** Open or closed, in words and with an icon (never colour alone). */
export function QuarterStatusTag({ status }: { status: QuarterStatus }) {
  return status === 'open' ? (
    <Tag minimal intent={Intent.SUCCESS} icon="unlock">
      Open for extracts
    </Tag>
  ) : (
    <Tag minimal icon="lock">
      Closed
    </Tag>
  );
}
