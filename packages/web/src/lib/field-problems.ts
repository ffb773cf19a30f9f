/**
 * The field problems of a refused request (RFC 9457 `errors[]`), for forms
 * that show each one next to the field it names. `field` is the API's path
 * (e.g. `submissionDeadline`, `definition.targets[1].threshold`).
 */
import { ApiError } from './api-client';

/** Every field problem, by field (the first message when a field has several). */
export function fieldProblems(error: unknown): Map<string, string> {
  const out = new Map<string, string>();
  if (!(error instanceof ApiError)) return out;
  for (const e of error.problem.errors ?? []) {
    if (!out.has(e.field)) out.set(e.field, sentence(e.message));
  }
  return out;
}

/** "must be at least 1" → "Must be at least 1." */
export function sentence(message: string): string {
  const text = message.charAt(0).toUpperCase() + message.slice(1);
  return /[.!?]$/.test(text) ? text : `${text}.`;
}
