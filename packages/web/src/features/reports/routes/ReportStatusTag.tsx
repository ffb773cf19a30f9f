import { Intent, Tag } from '@blueprintjs/core';
import type { Report } from '../../../lib/api/types';

const words: Record<
  Report['status'],
  { text: string; intent: Intent; icon: 'tick' | 'swap-horizontal' | 'disable' }
> = {
  published: { text: 'Published', intent: Intent.SUCCESS, icon: 'tick' },
  replaced: { text: 'Replaced', intent: Intent.NONE, icon: 'swap-horizontal' },
  withdrawn: { text: 'Withdrawn', intent: Intent.DANGER, icon: 'disable' },
};

/** A report's standing, in words and an icon (never by colour alone). */
export function ReportStatusTag({ status }: { status: Report['status'] }) {
  const w = words[status];
  return (
    <Tag minimal intent={w.intent} icon={w.icon}>
      {w.text}
    </Tag>
  );
}
