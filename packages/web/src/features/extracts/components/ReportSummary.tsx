import { Button, HTMLTable } from '@blueprintjs/core';
import { formatCount } from '../../../lib/format';
import type { IssueCount, Submission } from '../../../lib/api/types';
import { Figure } from './Figure';
import { SeverityTag } from './StatusTag';

interface Props {
  submission: Submission;
  /** Chosen code in the issues table, if any */
  activeCode?: string;
  onPickCode?: (code: string) => void;
}

/** The validation report at a glance: rows read, accepted, refused; issues by code. */
export function ReportSummary({ submission, activeCode, onPickCode }: Props) {
  const counts = submission.counts;
  if (!counts) return null;
  const byCode = submission.issuesByCode.filter((c) => c.severity !== 'refusal');
  return (
    <section className="cairn-report-summary" aria-labelledby="cairn-summary-heading">
      <h2 id="cairn-summary-heading" className="bp6-heading">
        Summary
      </h2>
      <div className="cairn-figures" role="list">
        <div role="listitem">
          <Figure label="Rows read" value={counts.rowsRead} />
        </div>
        <div role="listitem">
          <Figure label="Rows accepted" value={counts.rowsAccepted} note="kept as care records" />
        </div>
        <div role="listitem">
          <Figure
            label="Rows refused"
            value={counts.rowsRejected}
            note="left out; fix and resend"
          />
        </div>
        <div role="listitem">
          <Figure label="Warnings" value={counts.warnings} note="rows kept" />
        </div>
        <div role="listitem">
          <Figure label="Data-quality flags" value={counts.flags} note="rows kept" />
        </div>
      </div>
      {counts.rowsBlank > 0 ? (
        <p className="cairn-muted">
          {formatCount(counts.rowsBlank)} blank {counts.rowsBlank === 1 ? 'row was' : 'rows were'}{' '}
          skipped.
        </p>
      ) : null}
      {byCode.length > 0 ? (
        <HTMLTable compact className="cairn-by-code" aria-label="Issues by kind">
          <thead>
            <tr>
              <th>Kind</th>
              <th>What Cairn found</th>
              <th className="cairn-number">Times</th>
              {onPickCode ? (
                <th>
                  <span className="visually-hidden">Show in the table</span>
                </th>
              ) : null}
            </tr>
          </thead>
          <tbody>
            {byCode.map((c: IssueCount) => (
              <tr key={c.code} className={activeCode === c.code ? 'cairn-active-row' : undefined}>
                <td>
                  <SeverityTag severity={c.severity} />
                </td>
                {/* The code stays available for support, as a tooltip. */}
                <td title={`Code: ${c.code}`}>{c.title}</td>
                <td className="cairn-number">{formatCount(c.count)}</td>
                {onPickCode ? (
                  <td>
                    <Button
                      size="small"
                      variant="minimal"
                      icon="filter"
                      aria-label={`Show only “${c.title}” in the table`}
                      onClick={() => onPickCode(c.code)}
                    >
                      Show
                    </Button>
                  </td>
                ) : null}
              </tr>
            ))}
          </tbody>
        </HTMLTable>
      ) : (
        <p>No problems were found in any row.</p>
      )}
    </section>
  );
}
