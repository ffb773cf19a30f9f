import { H2, HTMLTable } from '@blueprintjs/core';
import { FlagMark } from '../../../components/charts/FlagMark';
import { IntervalBar, intervalText } from '../../../components/charts/IntervalBar';
import { RunSparkline, sparklineText } from '../../../components/charts/RunSparkline';
import { signalSentences } from '../../../components/charts/run-signals';
import type { PracticeMeasureResult, PracticeResults, TypeSplit } from '../../../lib/api/types';
import { formatCount, formatPercent } from '../../../lib/format';
import { changeText, improvementText } from './words';

/**
 * Every care process or every treatment target of the practice: rate with
 * its interval and the region median, flag, change, trend and improvement
 * potential. `asTables` swaps the drawings for their figures in words.
 */
export function MeasuresTable({
  title,
  results,
  measures,
  split,
  asTables,
}: {
  title: string;
  results: PracticeResults;
  measures: PracticeMeasureResult[];
  split: TypeSplit;
  asTables: boolean;
}) {
  const labels = results.quarters.map((q) => q.quarterLabel);
  const id = `results-${title.replace(/\W+/g, '-').toLowerCase()}`;
  return (
    <section aria-labelledby={id} className="cairn-results-section">
      <H2 id={id}>{title}</H2>
      <HTMLTable compact className="cairn-results-table">
        <thead>
          <tr>
            <th scope="col">Measure</th>
            <th scope="col">Rate</th>
            <th scope="col">95 % interval and region median</th>
            <th scope="col">Against the region</th>
            <th scope="col">Since last quarter</th>
            <th scope="col">Quarters</th>
          </tr>
        </thead>
        <tbody>
          {measures.map(({ measure, splits }) => {
            const result = splits.find((s) => s.split === split);
            if (!result) return null;
            const own = result.own;
            const trendPoints = result.trend.points.map((p, i) => ({
              label: labels[i] ?? '',
              rate: p.rate,
            }));
            return (
              <tr key={measure.key} data-measure={measure.key}>
                <th scope="row" className="cairn-results-measure">
                  <div className="cairn-results-label">{measure.label}</div>
                  <div className="cairn-muted cairn-small" title={measure.denominatorText}>
                    {measure.denominator === 'eligible'
                      ? 'Out of everyone eligible'
                      : 'Out of those with a measurement'}
                    {measure.population.minAge != null || measure.population.maxAge != null
                      ? ` · ${measure.population.text}`
                      : ''}
                  </div>
                  <div className="cairn-muted cairn-small">Guideline: {measure.source}</div>
                  <div className="cairn-results-improvement">
                    {improvementText(result, measure)}
                  </div>
                </th>
                <td className="cairn-results-rate">
                  <strong>{formatPercent(own.rate)}</strong>
                  <div className="cairn-muted cairn-small">
                    {formatCount(own.events)} of {formatCount(own.n)}
                  </div>
                </td>
                <td>
                  {asTables ? (
                    <span className="cairn-small">
                      {intervalText({
                        rate: own.rate,
                        lower: own.interval.lower,
                        upper: own.interval.upper,
                        median: result.region.median,
                      })}
                    </span>
                  ) : (
                    <IntervalBar
                      rate={own.rate}
                      lower={own.interval.lower}
                      upper={own.interval.upper}
                      median={result.region.median}
                    />
                  )}
                </td>
                <td>
                  <FlagMark flag={own.exact} />
                  {result.region.overdispersion ? (
                    <div className="cairn-small cairn-muted">
                      Allowing for over-dispersion: <FlagMark flag={own.adjusted} />
                    </div>
                  ) : null}
                </td>
                <td className="cairn-small">{changeText(result, measure)}</td>
                <td>
                  {asTables ? (
                    <ul className="cairn-results-trend-list">
                      {trendPoints.map((p) => (
                        <li key={p.label}>
                          {p.label}: {p.rate == null ? 'no figure' : formatPercent(p.rate)}
                        </li>
                      ))}
                      <li>
                        {sparklineText({ points: trendPoints, signals: result.trend.signals })}
                      </li>
                    </ul>
                  ) : (
                    <>
                      <RunSparkline points={trendPoints} signals={result.trend.signals} />
                      {signalSentences(result.trend.signals, labels).map((line) => (
                        <div key={line} className="cairn-small cairn-results-signal">
                          {line}
                        </div>
                      ))}
                    </>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </HTMLTable>
    </section>
  );
}
