import { Card } from '@blueprintjs/core';
import type { ReactNode } from 'react';
import { formatCount } from '../../../lib/format';

/** One headline count on a card (report summary, coverage totals). */
export function Figure({ label, value, note }: { label: ReactNode; value: number; note?: string }) {
  return (
    <Card className="cairn-figure" compact>
      <div className="cairn-figure-value">{formatCount(value)}</div>
      <div className="cairn-figure-label">{label}</div>
      {note ? <div className="cairn-figure-note cairn-muted">{note}</div> : null}
    </Card>
  );
}
