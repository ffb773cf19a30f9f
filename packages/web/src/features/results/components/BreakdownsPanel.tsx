import { FormGroup, H2, HTMLSelect, HTMLTable } from '@blueprintjs/core';
import { useId, useState } from 'react';
import { IntervalBar } from '../../../components/charts/IntervalBar';
import type { PracticeDetail, PracticeMeasureResult, TypeSplit } from '../../../lib/api/types';
import { formatCount, formatPercent } from '../../../lib/format';

/**
 * A measure broken down by age band, sex, deprivation and duration: the
 * practice's rate and interval in each category beside the region's rate.
 */
export function BreakdownsPanel({
  measures,
  detail,
  split,
  asTables,
}: {
  /** The practice's measures (their labels and guidelines), as its results list them */
  measures: PracticeMeasureResult[];
  detail: PracticeDetail;
  split: TypeSplit;
  asTables: boolean;
}) {
  const selectId = useId();
  const [measureKey, setMeasureKey] = useState(measures[0]?.measure.key ?? '');
  const measure = measures.find((m) => m.measure.key === measureKey)?.measure;
  const cells = detail.measures
    .find((m) => m.measure === measureKey)
    ?.splits.find((s) => s.split === split);
  return (
    <div>
      <FormGroup label="Measure" labelFor={selectId} inline>
        <HTMLSelect
          id={selectId}
          value={measureKey}
          onChange={(e) => setMeasureKey(e.currentTarget.value)}
          options={measures.map((m) => ({ value: m.measure.key, label: m.measure.label }))}
        />
      </FormGroup>
      {measure ? <p className="cairn-muted cairn-small">Guideline: {measure.source}</p> : null}
      {cells
        ? detail.breakdowns.map((breakdown) => {
            const found = cells.breakdowns.find((b) => b.breakdown === breakdown.key);
            if (!found) return null;
            const id = `breakdown-${breakdown.key}`;
            return (
              <section key={breakdown.key} aria-labelledby={id} className="cairn-results-section">
                <H2 id={id}>{breakdown.label}</H2>
                <HTMLTable compact className="cairn-results-table">
                  <thead>
                    <tr>
                      <th scope="col">{breakdown.label}</th>
                      <th scope="col">Practice</th>
                      <th scope="col">Practice rate and 95 % interval; region rate marked</th>
                      <th scope="col">Region</th>
                    </tr>
                  </thead>
                  <tbody>
                    {found.cells.map((cell) => {
                      const label =
                        breakdown.categories.find((c) => c.key === cell.category)?.label ??
                        cell.category;
                      return (
                        <tr key={cell.category}>
                          <th scope="row">{label}</th>
                          <td>
                            {formatPercent(cell.practice.rate)}{' '}
                            <span className="cairn-muted cairn-small">
                              ({formatCount(cell.practice.events)} of {formatCount(cell.practice.n)}
                              )
                            </span>
                          </td>
                          <td>
                            {asTables ? (
                              <span className="cairn-small">
                                {formatPercent(cell.practice.interval.lower)} to{' '}
                                {formatPercent(cell.practice.interval.upper)}
                              </span>
                            ) : (
                              <IntervalBar
                                rate={cell.practice.rate}
                                lower={cell.practice.interval.lower}
                                upper={cell.practice.interval.upper}
                                median={cell.region.rate}
                                markLabel="region rate"
                              />
                            )}
                          </td>
                          <td>
                            {cell.region.rate == null
                              ? 'withheld'
                              : formatPercent(cell.region.rate)}{' '}
                            <span className="cairn-muted cairn-small">
                              ({cell.region.events.display} of {cell.region.n.display})
                            </span>
                          </td>
                        </tr>
                      );
                    })}
                  </tbody>
                </HTMLTable>
              </section>
            );
          })
        : null}
    </div>
  );
}
