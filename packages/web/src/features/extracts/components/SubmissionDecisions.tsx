import { Alert, Button, Intent } from '@blueprintjs/core';
import { useState } from 'react';
import { ProblemCallout } from '../../../components/ProblemCallout';
import type { Submission } from '../../../lib/api/types';
import { formatCount, formatDateTime } from '../../../lib/format';
import { type SubmissionDecision, useSubmissionDecision } from '../api/mutations';

interface Props {
  submission: Submission;
  /** The submission now current for the same practice and quarter, if another one */
  current: Submission | null;
}

/**
 * Confirm, Cancel and Retry: shown only when the server says the signed-in
 * person may take them (never to auditors, nor after a quarter closed).
 */
export function SubmissionDecisions({ submission, current }: Props) {
  const decide = useSubmissionDecision(submission.practice.id, submission.id);
  const [asking, setAsking] = useState<SubmissionDecision | null>(null);
  const { actions } = submission;
  if (!actions.confirm && !actions.cancel && !actions.retry) return null;

  const run = (decision: SubmissionDecision) => {
    decide.mutate(decision, { onSettled: () => setAsking(null) });
  };
  const accepted = formatCount(submission.counts?.rowsAccepted ?? 0);
  const refused = submission.counts?.rowsRejected ?? 0;

  return (
    <div className="cairn-decisions">
      <div className="cairn-decision-buttons">
        {actions.confirm ? (
          <Button
            intent={Intent.PRIMARY}
            icon="tick"
            size="large"
            loading={decide.isPending && decide.variables === 'confirm'}
            onClick={() => setAsking('confirm')}
          >
            Confirm submission
          </Button>
        ) : null}
        {actions.retry ? (
          <Button
            intent={Intent.PRIMARY}
            icon="refresh"
            loading={decide.isPending && decide.variables === 'retry'}
            onClick={() => run('retry')}
          >
            Check again
          </Button>
        ) : null}
        {actions.cancel ? (
          <Button
            icon="disable"
            loading={decide.isPending && decide.variables === 'cancel'}
            onClick={() => setAsking('cancel')}
          >
            Cancel submission
          </Button>
        ) : null}
      </div>
      <ProblemCallout error={decide.error} />

      <Alert
        isOpen={asking === 'confirm'}
        intent={Intent.PRIMARY}
        icon="tick-circle"
        confirmButtonText="Confirm submission"
        cancelButtonText="Not now"
        loading={decide.isPending}
        onConfirm={() => run('confirm')}
        onCancel={() => setAsking(null)}
        canEscapeKeyCancel
      >
        <p>
          <strong>
            Make submission {submission.id} the current submission of {submission.practice.name} for{' '}
            {submission.quarter.label}?
          </strong>
        </p>
        <p>
          Its {accepted} accepted {accepted === '1' ? 'row' : 'rows'} will be used for the audit
          quarter&apos;s figures and benchmark.
          {refused > 0
            ? ` The ${formatCount(refused)} refused ${refused === 1 ? 'row is' : 'rows are'} left out.`
            : ''}
        </p>
        {current ? (
          <p>
            It replaces the current submission {current.id} (uploaded{' '}
            {formatDateTime(current.uploadedAt)} by {current.uploadedBy}), which will be marked
            superseded and no longer used.
          </p>
        ) : (
          <p>The practice has no current submission for this quarter yet.</p>
        )}
      </Alert>

      <Alert
        isOpen={asking === 'cancel'}
        intent={Intent.DANGER}
        icon="disable"
        confirmButtonText="Cancel submission"
        cancelButtonText="Keep it"
        loading={decide.isPending}
        onConfirm={() => run('cancel')}
        onCancel={() => setAsking(null)}
        canEscapeKeyCancel
      >
        <p>
          <strong>Cancel submission {submission.id}?</strong>
        </p>
        <p>
          Nothing from this file will be used, and its report stays in the history.
          {current ? ` The current submission ${current.id} stays current.` : ''}
        </p>
      </Alert>
    </div>
  );
}
