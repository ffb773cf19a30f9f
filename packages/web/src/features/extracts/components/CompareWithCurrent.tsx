import { HTMLTable } from '@blueprintjs/core';
import type { Submission } from '../../../lib/api/types';
import { formatCount, formatDateTime } from '../../../lib/format';

const rows: { label: string; value: (s: Submission) => number | null | undefined }[] = [
  { label: 'Rows read', value: (s) => s.counts?.rowsRead },
  { label: 'Rows accepted (the records used)', value: (s) => s.counts?.rowsAccepted },
  { label: 'Rows refused (left out)', value: (s) => s.counts?.rowsRejected },
  { label: 'Warnings', value: (s) => s.counts?.warnings },
  { label: 'Data-quality flags', value: (s) => s.counts?.flags },
];

/** An extract awaiting confirmation beside the current submission it would replace: the choice, in figures. */
export function CompareWithCurrent({
  candidate,
  current,
}: {
  candidate: Submission;
  current: Submission;
}) {
  const now = current.counts?.rowsAccepted ?? 0;
  const next = candidate.counts?.rowsAccepted ?? 0;
  return (
    <section className="cairn-compare" aria-labelledby="cairn-compare-heading">
      <h2 id="cairn-compare-heading" className="bp6-heading">
        Compare with the current submission
      </h2>
      <p>
        Confirming submission {candidate.id} replaces the {formatCount(now)}{' '}
        {now === 1 ? 'record' : 'records'} of submission {current.id} with {formatCount(next)}.
        {next < now
          ? ` That is ${formatCount(now - next)} fewer: check that the refused rows are not people who should be counted.`
          : ''}
      </p>
      <HTMLTable compact className="cairn-compare-table">
        <thead>
          <tr>
            <th scope="col">
              <span className="visually-hidden">Figure</span>
            </th>
            <th scope="col" className="cairn-number">
              This extract (submission {candidate.id})
            </th>
            <th scope="col" className="cairn-number">
              Current (submission {current.id})
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={row.label}>
              <th scope="row">{row.label}</th>
              <td className="cairn-number">{formatCount(row.value(candidate))}</td>
              <td className="cairn-number">{formatCount(row.value(current))}</td>
            </tr>
          ))}
          <tr>
            <th scope="row">Uploaded</th>
            <td className="cairn-number">
              {formatDateTime(candidate.uploadedAt)} by {candidate.uploadedBy}
            </td>
            <td className="cairn-number">
              {formatDateTime(current.uploadedAt)} by {current.uploadedBy}
            </td>
          </tr>
        </tbody>
      </HTMLTable>
    </section>
  );
}
