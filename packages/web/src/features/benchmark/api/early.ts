/**
 * The region benchmark page's first requests, started by its route loader as navigation
 * begins: in parallel with loading the page's code and checking the sign-in, instead of after
 * them. Small on purpose (it is part of the app's first script). A request is handed once to
 * the query that asks for the same path within a few seconds; the API still decides who may
 * read (a refused request is simply not used).
 */
import type { LoaderFunctionArgs } from 'react-router-dom';
import { apiFetch } from '../../../lib/api-client';
import type { TypeSplit } from '../../../lib/api/types';

const KEEP_MS = 10_000;
const early = new Map<string, { at: number; promise: Promise<unknown> }>();

export function regionBenchmarkPath(quarterId: number, split: TypeSplit, locality: string): string {
  const query = new URLSearchParams({ split });
  if (locality) query.set('locality', locality);
  return `/api/quarters/${quarterId}/benchmark?${query.toString()}`;
}

export function funnelPath(quarterId: number, measure: string, split: TypeSplit): string {
  return `/api/quarters/${quarterId}/benchmark/measures/${encodeURIComponent(measure)}?split=${split}`;
}

function fetchEarly(path: string): void {
  if (early.has(path)) return;
  const promise = apiFetch<unknown>(path);
  // Handled here so that a request nobody takes (or a refused one) is not an unhandled rejection.
  promise.catch(() => undefined);
  early.set(path, { at: Date.now(), promise });
}

/** The early request for `path`, once, if it is recent; otherwise undefined. */
export function takeEarly<T>(path: string): Promise<T> | undefined {
  const found = early.get(path);
  early.delete(path);
  if (!found || Date.now() - found.at > KEEP_MS) return undefined;
  return found.promise as Promise<T>;
}

/** Route loader of /benchmark: when the address names the quarter, ask at once. */
export function benchmarkLoader({ request }: LoaderFunctionArgs): null {
  const params = new URL(request.url).searchParams;
  const quarter = Number(params.get('quarter'));
  if (!Number.isInteger(quarter) || quarter <= 0) return null;
  const asked = params.get('split');
  const split: TypeSplit = asked === 'type1' || asked === 'type2_other' ? asked : 'all';
  fetchEarly(regionBenchmarkPath(quarter, split, params.get('locality') ?? ''));
  const measure = params.get('measure');
  if (measure) fetchEarly(funnelPath(quarter, measure, split));
  return null;
}
