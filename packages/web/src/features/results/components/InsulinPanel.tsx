import { HTMLTable } from '@blueprintjs/core';
import { ChartOrTable } from '../../../components/charts/ChartOrTable';
import { SurvivalChart } from '../../../components/charts/SurvivalChart';
import type { PracticeDetail, Survival } from '../../../lib/api/types';
import { formatPercent } from '../../../lib/format';

function medianWords(s: Survival): string {
  return s.median == null ? 'not reached' : `${s.median} years`;
}

/** Type 2: time from diagnosis to insulin, the practice against the region. */
export function InsulinPanel({ detail }: { detail: PracticeDetail }) {
  const { practice, region, ruleOfThumbYears } = detail.progression;
  const times = [
    ...new Set([...practice.steps.map((s) => s.time), ...region.steps.map((s) => s.time)]),
  ].sort((a, b) => a - b);
  return (
    <div>
      <p>
        People with type 2 diabetes not yet on insulin, by years since diagnosis (Kaplan–Meier
        estimate; people not on insulin count until the end of the review window). Practice:{' '}
        {practice.n.display} people, {practice.events.display} insulin starts, median{' '}
        {medianWords(practice)}. Region: median {medianWords(region)}. The reference line is a rule
        of thumb of the field (about {ruleOfThumbYears} years from diagnosis to insulin on average;
        common practice, no single source), not a target.
      </p>
      {practice.excluded > 0 ? (
        <p className="cairn-muted cairn-small">
          {practice.excluded} people left out for incomplete or inconsistent insulin data.
        </p>
      ) : null}
      <ChartOrTable
        label="Time to insulin"
        chart={
          <SurvivalChart
            practice={{ label: 'Practice', steps: practice.steps, median: practice.median }}
            region={{ label: 'Region', steps: region.steps, median: region.median }}
            ruleOfThumbYears={ruleOfThumbYears}
          />
        }
        table={
          <HTMLTable compact className="cairn-results-table">
            <thead>
              <tr>
                <th scope="col">Years since diagnosis</th>
                <th scope="col">Practice: at risk</th>
                <th scope="col">Practice: insulin starts</th>
                <th scope="col">Practice: not yet on insulin</th>
                <th scope="col">Region: at risk</th>
                <th scope="col">Region: insulin starts</th>
                <th scope="col">Region: not yet on insulin</th>
              </tr>
            </thead>
            <tbody>
              {times.map((t) => {
                const p = practice.steps.find((s) => s.time === t);
                const r = region.steps.find((s) => s.time === t);
                return (
                  <tr key={t}>
                    <th scope="row">{t}</th>
                    <td>{p?.atRisk.display ?? '—'}</td>
                    <td>{p?.events.display ?? '—'}</td>
                    <td>{p ? formatPercent(p.survival) : '—'}</td>
                    <td>{r?.atRisk.display ?? '—'}</td>
                    <td>{r?.events.display ?? '—'}</td>
                    <td>{r ? formatPercent(r.survival) : '—'}</td>
                  </tr>
                );
              })}
            </tbody>
          </HTMLTable>
        }
      />
    </div>
  );
}
