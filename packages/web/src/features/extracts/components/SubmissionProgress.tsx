import { Intent, ProgressBar } from '@blueprintjs/core';
import { formatCount } from '../../../lib/format';
import type { Submission } from '../../../lib/api/types';

const phaseText: Record<NonNullable<Submission['phase']>, string> = {
  queued: 'Waiting its turn to be checked…',
  uploading: 'Receiving the file…',
  reading: 'Reading and checking rows…',
};

/**
 * How far Cairn is in checking the extract: rows checked of rows in the file.
 * Until the number of rows is known, the bar runs without a value.
 */
export function SubmissionProgress({ submission }: { submission: Submission }) {
  const { rowsDone, rowsTotal } = submission.progress;
  const known = rowsTotal !== null && rowsTotal > 0;
  const fraction = known ? Math.min(rowsDone / rowsTotal, 1) : undefined;
  const words = known
    ? `${formatCount(rowsDone)} of ${formatCount(rowsTotal)} rows checked`
    : rowsDone > 0
      ? `${formatCount(rowsDone)} rows checked`
      : (phaseText[submission.phase ?? 'queued'] ?? 'Starting…');
  return (
    <div className="cairn-progress" aria-live="polite">
      <div className="cairn-progress-head">
        <strong>Checking the extract</strong>
        <span className="cairn-muted">{words}</span>
      </div>
      <ProgressBar
        intent={Intent.PRIMARY}
        value={fraction}
        aria-label="Rows checked"
        aria-valuetext={words}
      />
      <p className="cairn-muted cairn-progress-note">
        You can leave this page: the check goes on, and the report will be here when you come back
        (Submissions lists it).
      </p>
    </div>
  );
}
