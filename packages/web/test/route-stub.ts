/**
 * A fetch that answers by method and path ("PUT /api/measure-sets/x"), each
 * answer a value or a function of the request body; and the requests made.
 */
import { vi } from 'vitest';

export type Answer = { status?: number; body: unknown };
export type Route = Answer | ((body: unknown) => Answer);

export function stubRoutes(routes: Record<string, Route>) {
  const calls: { method: string; path: string; body: unknown }[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url =
      typeof input === 'string' ? input : input instanceof URL ? input.pathname : input.url;
    const path = url.replace(/^https?:\/\/[^/]+/, '');
    const method = (init?.method ?? 'GET').toUpperCase();
    const body = typeof init?.body === 'string' ? (JSON.parse(init.body) as unknown) : undefined;
    calls.push({ method, path, body });
    const route = routes[`${method} ${path}`];
    const answer: Answer = route
      ? typeof route === 'function'
        ? route(body)
        : route
      : { status: 404, body: { type: '/api/problems/not-found', title: 'Not found', status: 404 } };
    const status = answer.status ?? 200;
    return new Response(JSON.stringify(answer.body), {
      status,
      headers: { 'Content-Type': status >= 400 ? 'application/problem+json' : 'application/json' },
    });
  });
  vi.stubGlobal('fetch', fetchMock);
  return { fetchMock, calls };
}
