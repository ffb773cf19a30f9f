import { Intent } from '@blueprintjs/core';
import { ApiError } from '../lib/api-client';
import { Notice } from './Notice';

/** A failed request explained in place: the API's own title and detail. */
export function ProblemCallout({ error }: { error: unknown }) {
  if (!error) return null;
  const problem = error instanceof ApiError ? error.problem : null;
  return (
    <Notice
      intent={Intent.DANGER}
      icon="error"
      title={problem?.title ?? 'That did not work'}
      className="cairn-problem"
    >
      {problem?.detail ?? (error instanceof Error ? error.message : String(error))}
      {problem?.status === 401 ? (
        <p>
          <a href={`/sign-in?returnTo=${encodeURIComponent(window.location.pathname)}`}>
            Sign in again
          </a>
        </p>
      ) : null}
    </Notice>
  );
}

/** The API's message for one field of a validation problem, if any. */
export function fieldError(error: unknown, field: string): string | undefined {
  if (!(error instanceof ApiError)) return undefined;
  const found = error.problem.errors?.find((e) => e.field === field);
  return found ? `${found.field} ${found.message}` : undefined;
}
