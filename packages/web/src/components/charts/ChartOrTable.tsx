import { Switch } from '@blueprintjs/core';
import { type ReactNode, useId, useState } from 'react';

/**
 * Every chart has a table alternative: a switch shows the same figures as a
 * table instead of the drawing.
 */
export function ChartOrTable({
  chart,
  table,
  label,
  initial = 'chart',
}: {
  chart: ReactNode;
  table: ReactNode;
  /** What the chart shows, e.g. "Time to insulin" */
  label: string;
  initial?: 'chart' | 'table';
}) {
  const [asTable, setAsTable] = useState(initial === 'table');
  const id = useId();
  return (
    <div className="cairn-chart-or-table">
      <Switch
        id={id}
        className="cairn-chart-switch"
        checked={asTable}
        label={`Show ${label.toLowerCase()} as a table`}
        onChange={(e) => setAsTable(e.currentTarget.checked)}
      />
      {asTable ? table : chart}
    </div>
  );
}
