import { H2, HTMLTable } from '@blueprintjs/core';
import { PeerStrip, peerStripText } from '../../../components/charts/PeerStrip';
import type { PracticeMeasureResult, PracticeResults, TypeSplit } from '../../../lib/api/types';

/**
 * Each measure's rate among the region's other practices: unnamed points as the API disclosed
 * them (a practice lead never sees small peers; `peers.withheld` says how many were left out).
 */
export function PeersPanel({
  results,
  split,
  asTables,
}: {
  results: PracticeResults;
  split: TypeSplit;
  asTables: boolean;
}) {
  const groups: [string, PracticeMeasureResult[]][] = [
    ['Care processes', results.measures.filter((m) => m.measure.kind === 'care_process')],
    ['Treatment targets', results.measures.filter((m) => m.measure.kind === 'treatment_target')],
  ];
  return (
    <div>
      <p>
        Where {results.practice.code} sits among the region&apos;s other practices, which are not
        named: each dot is another practice, the shape is {results.practice.code} with its flag, the
        dashed tick the region median.
        {results.disclosure === 'applied'
          ? ' Practices with fewer than 10 people in a measure, or 1 to 4 events, are left out.'
          : ''}
      </p>
      {groups.map(([title, measures]) => {
        const id = `peers-${title.replace(/\W+/g, '-').toLowerCase()}`;
        return (
          <section key={title} aria-labelledby={id} className="cairn-results-section">
            <H2 id={id}>{title}</H2>
            <HTMLTable compact className="cairn-results-table">
              <thead>
                <tr>
                  <th scope="col">Measure</th>
                  <th scope="col">Among the region&apos;s practices</th>
                </tr>
              </thead>
              <tbody>
                {measures.map(({ measure, splits }) => {
                  const result = splits.find((s) => s.split === split);
                  if (!result) return null;
                  const strip = {
                    title: measure.label,
                    own: {
                      label: results.practice.code,
                      rate: result.own.rate,
                      flag: result.own.exact,
                    },
                    peers: result.peers,
                    median: result.region.median,
                  };
                  return (
                    <tr key={measure.key} data-measure={measure.key}>
                      <th scope="row">{measure.label}</th>
                      <td>
                        {asTables ? null : <PeerStrip {...strip} />}
                        <div className="cairn-small">{peerStripText(strip)}</div>
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </HTMLTable>
          </section>
        );
      })}
    </div>
  );
}
