/**
 * The one way the web talks to the API: same-origin fetch, JSON in and out,
 * RFC 9457 problem details turned into an ApiError that screens can show.
 */

import type { Problem } from './api/types';

export type { FieldProblem } from './api/types';

/** A problem as received: its documented fields, and whatever extensions the route adds. */
export type ProblemDetails = Problem & { [extension: string]: unknown };

export class ApiError extends Error {
  constructor(readonly problem: ProblemDetails) {
    super(problem.detail ? `${problem.title}: ${problem.detail}` : problem.title);
    this.name = 'ApiError';
  }

  get status(): number {
    return this.problem.status;
  }
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Headers added to every state-changing request (the CSRF token, once signed in). */
let writeHeaders: () => Record<string, string> = () => ({});
export function setWriteHeaders(provider: () => Record<string, string>): void {
  writeHeaders = provider;
}

export async function apiFetch<T>(path: string, init: RequestInit = {}): Promise<T> {
  const method = (init.method ?? 'GET').toUpperCase();
  const headers = new Headers(init.headers);
  headers.set('Accept', 'application/json, application/problem+json');
  if (init.body !== undefined && typeof init.body === 'string' && !headers.has('Content-Type')) {
    headers.set('Content-Type', 'application/json');
  }
  if (!SAFE_METHODS.has(method)) {
    for (const [name, value] of Object.entries(writeHeaders())) headers.set(name, value);
  }
  let response: Response;
  try {
    response = await fetch(path, { ...init, method, headers, credentials: 'same-origin' });
  } catch {
    throw new ApiError({
      type: 'about:blank',
      title: 'Cairn cannot be reached',
      status: 0,
      detail: 'Check your connection and try again.',
    });
  }
  if (response.status === 204) return undefined as T;
  const type = response.headers.get('Content-Type') ?? '';
  const body: unknown = type.includes('json') ? await response.json().catch(() => null) : null;
  if (!response.ok) {
    const problem =
      body && typeof body === 'object' && 'title' in body
        ? (body as ProblemDetails)
        : {
            type: 'about:blank',
            title: response.statusText || 'Request failed',
            status: response.status,
          };
    throw new ApiError({ ...problem, status: response.status });
  }
  return body as T;
}

export const apiJson = (body: unknown): RequestInit => ({ body: JSON.stringify(body) });
