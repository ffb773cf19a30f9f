import { HTMLTable } from '@blueprintjs/core';
import { Notice } from '../../../components/Notice';
import type { DataQualityCount } from '../../../lib/api/types';
import { formatCount } from '../../../lib/format';

/** Clinical data-quality flags of the submission: kept records that need a second look. */
export function QualityPanel({ flags }: { flags: DataQualityCount[] }) {
  const raised = flags.filter((f) => f.count > 0);
  if (raised.length === 0) {
    return (
      <Notice icon="tick" title="No data-quality flags">
        No record of this submission raised a clinical data-quality flag.
      </Notice>
    );
  }
  return (
    <div>
      <p>
        Records kept in the results but flagged as clinically unlikely. Check them in the clinical
        system; a corrected extract replaces this submission when it is confirmed.
      </p>
      <HTMLTable compact className="cairn-results-table">
        <thead>
          <tr>
            <th scope="col">Flag</th>
            <th scope="col">Records</th>
          </tr>
        </thead>
        <tbody>
          {raised.map((f) => (
            <tr key={f.code} data-flag={f.code}>
              <th scope="row">{f.title}</th>
              <td>{formatCount(f.count)}</td>
            </tr>
          ))}
        </tbody>
      </HTMLTable>
    </div>
  );
}
