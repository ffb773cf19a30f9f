import { Alert, Button, Intent } from '@blueprintjs/core';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Notice } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import type { Submission } from '../../../lib/api/types';
import { formatDateTime } from '../../../lib/format';
import { useCancelSubmissions } from '../api/mutations';

const list = (items: string[]) =>
  items.length <= 1
    ? items.join('')
    : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;

/**
 * Extracts left waiting behind a newer one (or behind the current submission): said, and offered
 * for cancelling together, so that they do not pile up unnoticed. Only those the API lets the
 * signed-in person cancel are passed in.
 */
export function OlderWaiting({
  practiceId,
  quarterLabel,
  older,
  newer,
}: {
  practiceId: number;
  quarterLabel: string;
  older: Submission[];
  /** What they are behind: the newest waiting extract, or the current submission */
  newer: Submission | null;
}) {
  const cancel = useCancelSubmissions(practiceId);
  const [asking, setAsking] = useState(false);
  if (older.length === 0) return null;
  const n = older.length;
  const names = older.map((s) => `submission ${s.id}`);
  const behind = newer
    ? newer.status === 'accepted'
      ? `uploaded before submission ${newer.id}, which is now current, so ${n === 1 ? 'it' : 'they'} can no longer be confirmed`
      : `uploaded before submission ${newer.id}`
    : 'uploaded earlier';
  return (
    <Notice
      intent={Intent.WARNING}
      icon="layers"
      className="cairn-older-waiting"
      title={`${n} older ${n === 1 ? 'extract' : 'extracts'} for ${quarterLabel} still ${n === 1 ? 'waits' : 'wait'}`}
    >
      <p>
        {older.map((s, i) => (
          <span key={s.id}>
            {i > 0 ? (i === older.length - 1 ? ' and ' : ', ') : ''}
            <Link to={`/practices/${practiceId}/submissions/${s.id}`}>Submission {s.id}</Link> (
            {s.file.name}, uploaded {formatDateTime(s.uploadedAt)})
          </span>
        ))}{' '}
        {n === 1 ? 'was' : 'were'} {behind}. Only one extract can be used for the quarter; cancel
        the older {n === 1 ? 'one' : 'ones'} once you have decided on the newest.
      </p>
      <Button
        icon="disable"
        loading={cancel.isPending}
        onClick={() => setAsking(true)}
        className="cairn-older-waiting-cancel"
      >
        Cancel the {n === 1 ? 'older extract' : `${n} older extracts`}
      </Button>
      <ProblemCallout error={cancel.error} />
      <Alert
        isOpen={asking}
        intent={Intent.DANGER}
        icon="disable"
        confirmButtonText={n === 1 ? 'Cancel it' : `Cancel all ${n}`}
        cancelButtonText="Keep them"
        loading={cancel.isPending}
        onConfirm={() =>
          cancel.mutate(
            older.map((s) => s.id),
            { onSettled: () => setAsking(false) },
          )
        }
        onCancel={() => setAsking(false)}
        canEscapeKeyCancel
      >
        <p>
          <strong>Cancel {list(names)}?</strong>
        </p>
        <p>
          Nothing from {n === 1 ? 'that file' : 'those files'} will be used; the reports stay in the
          history.
        </p>
      </Alert>
    </Notice>
  );
}
