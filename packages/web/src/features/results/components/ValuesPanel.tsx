import { H2 } from '@blueprintjs/core';
import { ChartOrTable } from '../../../components/charts/ChartOrTable';
import {
  ValueHistogram,
  type ValueHistogramProps,
  ValueHistogramTable,
} from '../../../components/charts/ValueHistogram';
import { EmptyState } from '../../../components/Notice';
import type { PracticeResultsDetail, TypeSplit } from '../../../lib/api/types';

/** The spread of each recorded value (HbA1c, blood pressure…), the practice against the region. */
export function ValuesPanel({
  results,
  split,
  asTables,
}: {
  /** The detail answer: the practice, the disclosure its region counts are under, the histograms */
  results: PracticeResultsDetail;
  split: TypeSplit;
  asTables: boolean;
}) {
  const values = results.detail?.values ?? [];
  if (values.length === 0) return <EmptyState icon="chart" title="No recorded values to show" />;
  return (
    <div>
      <p>
        Each value&apos;s latest reading in the review window, as the share of the people with a
        reading in each band: {results.practice.code} as bars, the region as a dashed outline.
        {results.disclosure === 'applied'
          ? ' Region counts from 1 to 4 show as “< 5” and are left out of the shares.'
          : ''}
      </p>
      {values.map((v) => {
        const counts = v.splits.find((s) => s.split === split);
        if (!counts) return null;
        const id = `values-${v.key}`;
        const props: ValueHistogramProps = {
          label: v.label,
          unit: v.unit,
          edges: v.edges,
          practice: counts.practice,
          region: counts.region,
          practiceLabel: results.practice.code,
        };
        return (
          <section key={v.key} aria-labelledby={id} className="cairn-results-section">
            <H2 id={id}>
              {v.label} ({v.unit})
            </H2>
            <p className="cairn-muted cairn-small">
              Not recorded: {counts.practice.notRecorded.display} in {results.practice.code},{' '}
              {counts.region.notRecorded.display} in the region.
            </p>
            {asTables ? (
              <ValueHistogramTable {...props} />
            ) : (
              <ChartOrTable
                label={v.label}
                chart={<ValueHistogram {...props} />}
                table={<ValueHistogramTable {...props} />}
              />
            )}
          </section>
        );
      })}
    </div>
  );
}
