import { Switch } from '@blueprintjs/core';
import { type ReactNode, useId, useState } from 'react';

/**
 * A label as it reads inside a sentence: its first letter lowered ("Time to insulin" → "time to
 * insulin"), unless the first word is an abbreviation kept as written (HbA1c, BMI, eGFR).
 */
export function inSentence(label: string): string {
  const word = label.split(/\s/)[0] ?? '';
  return word.slice(1) === word.slice(1).toLowerCase() && /^[A-Z]/.test(word)
    ? label.charAt(0).toLowerCase() + label.slice(1)
    : label;
}

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
        label={`Show ${inSentence(label)} as a table`}
        onChange={(e) => setAsTable(e.currentTarget.checked)}
      />
      {asTable ? table : chart}
    </div>
  );
}
