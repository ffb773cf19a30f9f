import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderApp, stubFetch } from '../../../test/render';
import type { Me } from '../../lib/api/types';
import { about } from '../../../test/signed-in';

/** The (url, init) pairs fetch was called with. */
const callsOf = (mock: { mock: { calls: unknown[][] } }) =>
  mock.mock.calls as unknown as [RequestInfo, RequestInit | undefined][];

const lead: Me = {
  id: 1,
  email: 'imogen@x.example',
  displayName: 'Imogen Varley',
  role: 'regional_lead',
  regionName: 'Ostrevale',
  practices: [],
  sessionExpiresAt: '2026-12-01T18:00:00.000Z',
};
const priya = {
  id: 3,
  email: 'priya@x.example',
  displayName: 'Priya Calloway',
  role: 'practice_lead',
  status: 'active',
  practices: [{ id: 12, code: 'OV102', name: 'Quarrybank Surgery' }],
  lastSignInAt: null,
  createdAt: '2026-11-01T10:00:00.000Z',
};
const options = {
  practices: [
    { id: 12, code: 'OV102', name: 'Quarrybank Surgery', localityName: 'Harnleigh Fold' },
    { id: 14, code: 'OV104', name: 'Fellgate Family Practice', localityName: 'Harnleigh Fold' },
  ],
  trustIdpRoles: false,
};

function stubLead(extra = {}) {
  return stubFetch({
    '/api/about': { body: about },
    '/api/session': { body: { user: lead, csrfToken: 'tok' } },
    '/api/users': { body: { users: [priya], trustIdpRoles: false } },
    '/api/users/options': { body: options },
    ...extra,
  });
}

afterEach(() => vi.unstubAllGlobals());

describe('users screen', () => {
  it('lists people for the regional lead', async () => {
    stubLead();
    renderApp('/users');
    expect(await screen.findByRole('heading', { name: 'Users' })).toBeTruthy();
    expect(await screen.findByText('1 person')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Add person' })).toBeTruthy();
  });

  it('validates a new person before sending, then posts with the CSRF token', async () => {
    // The same path answers the list (GET) and the new person (POST).
    const fetchMock = stubLead();
    const answerGet = fetchMock.getMockImplementation()!;
    fetchMock.mockImplementation(async (input: RequestInfo | URL, init?: RequestInit) =>
      init?.method === 'POST'
        ? new Response(JSON.stringify({ ...priya, id: 9, displayName: 'Alys Fenwick' }), {
            status: 201,
            headers: { 'Content-Type': 'application/json' },
          })
        : answerGet(input),
    );
    renderApp('/users');
    await userEvent.click(await screen.findByRole('button', { name: 'Add person' }));
    await screen.findByRole('dialog');
    await userEvent.click(screen.getAllByRole('button', { name: 'Add person' }).at(-1)!);
    expect(
      await screen.findByText('Enter an e-mail address such as name@practice.example.'),
    ).toBeTruthy();
    expect(screen.getByText('A practice lead needs at least one practice.')).toBeTruthy();
    expect(callsOf(fetchMock).some((c) => c[1]?.method === 'POST')).toBe(false);

    await userEvent.type(screen.getByLabelText('E-mail address'), 'alys@kettleholm.example');
    await userEvent.type(screen.getByLabelText('Name'), 'Alys Fenwick');
    await userEvent.selectOptions(screen.getByLabelText('Practice to add'), '14');
    await userEvent.click(screen.getByRole('button', { name: 'Add' }));
    await userEvent.click(screen.getAllByRole('button', { name: 'Add person' }).at(-1)!);
    await waitFor(() => expect(callsOf(fetchMock).some((c) => c[1]?.method === 'POST')).toBe(true));
    const post = callsOf(fetchMock).find((c) => c[1]?.method === 'POST')!;
    expect(JSON.parse(String(post[1]?.body))).toEqual({
      email: 'alys@kettleholm.example',
      displayName: 'Alys Fenwick',
      role: 'practice_lead',
      practiceIds: [14],
    });
    expect(new Headers(post[1]?.headers).get('X-CSRF-Token')).toBe('tok');
  });

  it('tells other roles the screen is not for them', async () => {
    stubFetch({
      '/api/about': { body: about },
      '/api/session': { body: { user: { ...lead, role: 'auditor' }, csrfToken: 't' } },
    });
    renderApp('/users');
    expect(await screen.findByText('Not available for your role')).toBeTruthy();
  });

  it('sends a signed-out visitor to sign in first, to come back here', async () => {
    stubFetch({
      '/api/about': { body: about },
      '/api/session': { body: { user: null, csrfToken: null } },
    });
    renderApp('/users');
    const button = await screen.findByRole('button', {
      name: "Continue to your organisation's sign-in",
    });
    expect(button.getAttribute('href')).toBe('/api/auth/saml/login?returnTo=%2Fusers');
  });
});
