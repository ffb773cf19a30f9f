/** Renders a route tree with the app's real providers and a fetch that answers from a table. */
import { render } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { vi } from 'vitest';
import { AppProviders } from '../src/app/providers';
import { createQueryClient } from '../src/app/query-client';
import { routes } from '../src/app/router';

export type FakeResponses = Record<string, { status?: number; body: unknown }>;

export function stubFetch(responses: FakeResponses) {
  const fetchMock = vi.fn(async (input: RequestInfo | URL) => {
    const url =
      typeof input === 'string' ? input : input instanceof URL ? input.pathname : input.url;
    const path = url.replace(/^https?:\/\/[^/]+/, '');
    const answer = responses[path];
    if (!answer) {
      return new Response(
        JSON.stringify({ type: '/api/problems/not-found', title: 'Not found', status: 404 }),
        {
          status: 404,
          headers: { 'Content-Type': 'application/problem+json' },
        },
      );
    }
    return new Response(JSON.stringify(answer.body), {
      status: answer.status ?? 200,
      headers: {
        'Content-Type':
          (answer.status ?? 200) >= 400 ? 'application/problem+json' : 'application/json',
      },
    });
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

export function renderApp(path = '/') {
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  return render(
    <AppProviders client={createQueryClient()}>
      <RouterProvider router={router} />
    </AppProviders>,
  );
}
