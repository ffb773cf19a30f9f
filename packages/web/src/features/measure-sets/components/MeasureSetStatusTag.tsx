import { Intent, Tag } from '@blueprintjs/core';
import type { MeasureSetStatus } from '../../../lib/api/types';

/** Draft or published, in words and with an icon (never colour alone). */
export function MeasureSetStatusTag({ status }: { status: MeasureSetStatus }) {
  return status === 'published' ? (
    <Tag minimal intent={Intent.SUCCESS} icon="endorsed">
      Published
    </Tag>
  ) : (
    <Tag minimal intent={Intent.WARNING} icon="edit">
      Draft
    </Tag>
  );
}
