import { afterEach, describe, expect, it, vi } from 'vitest';
import { ApiError, apiFetch, setWriteHeaders } from '../src/lib/api-client';

afterEach(() => {
  vi.unstubAllGlobals();
  setWriteHeaders(() => ({}));
});

describe('api client', () => {
  it('turns problem details into an ApiError carrying the problem', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(
        async () =>
          new Response(
            JSON.stringify({
              type: '/api/problems/validation',
              title: 'The request is not valid',
              status: 400,
              detail: 'see errors',
              errors: [{ field: 'name', message: 'is required' }],
            }),
            {
              status: 400,
              headers: { 'Content-Type': 'application/problem+json' },
            },
          ),
      ),
    );
    const error = await apiFetch('/api/x').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).status).toBe(400);
    expect((error as ApiError).problem.errors).toEqual([{ field: 'name', message: 'is required' }]);
    expect((error as ApiError).message).toBe('The request is not valid: see errors');
  });

  it('reports an unreachable server in plain words', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))),
    );
    const error = (await apiFetch('/api/x').catch((e: unknown) => e)) as ApiError;
    expect(error.status).toBe(0);
    expect(error.problem.title).toBe('Cairn cannot be reached');
  });

  it('adds write headers only to state-changing requests', async () => {
    const fetchMock = vi.fn(
      async (_input: RequestInfo | URL, _init?: RequestInit) => new Response(null, { status: 204 }),
    );
    vi.stubGlobal('fetch', fetchMock);
    setWriteHeaders(() => ({ 'X-CSRF-Token': 'abc' }));
    await apiFetch('/api/x');
    await apiFetch('/api/x', { method: 'POST', body: '{}' });
    const headersOf = (call: number) => new Headers(fetchMock.mock.calls[call]?.[1]?.headers);
    expect(headersOf(0).get('X-CSRF-Token')).toBeNull();
    expect(headersOf(1).get('X-CSRF-Token')).toBe('abc');
    expect(headersOf(1).get('Content-Type')).toBe('application/json');
  });
});
