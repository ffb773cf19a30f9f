import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderApp, stubFetch } from '../../../test/render';
import { about } from '../../../test/signed-in';

const lead = {
  id: 1,
  email: 'imogen@x.example',
  displayName: 'Imogen Varley',
  role: 'regional_lead',
  regionName: 'Ostrevale',
  practices: [],
};
const events = [
  {
    id: 7,
    occurredAt: '2026-12-01T10:00:00.000Z',
    action: 'auth.sign_in_refused',
    outcome: 'refused',
    actorUserId: null,
    actorLabel: 'sam.ashdown@kettleholm.example',
    actorName: null,
    practice: null,
    subjectType: null,
    subjectId: null,
    summary: 'Sign-in refused: the person is not known to Cairn',
    detail: { reason: 'unknown-user' },
    requestId: 'req-1',
    ipAddress: '127.0.0.1',
  },
  {
    id: 6,
    occurredAt: '2026-12-01T09:00:00.000Z',
    action: 'membership.added',
    outcome: 'success',
    actorUserId: 1,
    actorLabel: 'imogen@x.example',
    actorName: 'Imogen Varley',
    practice: { id: 14, code: 'OV104', name: 'Fellgate Family Practice' },
    subjectType: 'user',
    subjectId: '3',
    summary: 'Imogen Varley made Priya Calloway a lead of Fellgate Family Practice (OV104)',
    detail: null,
    requestId: null,
    ipAddress: null,
  },
];

afterEach(() => vi.unstubAllGlobals());

describe('audit trail screen', () => {
  it('lists events with their outcome in words and icons, and shows details on request', async () => {
    stubFetch({
      '/api/about': { body: about },
      '/api/session': { body: { user: lead, csrfToken: 't' } },
      '/api/audit-events?limit=100': { body: { events, nextBefore: 6 } },
      '/api/audit-events/actions': { body: [{ action: 'auth.sign_in_refused', count: 1 }] },
    });
    renderApp('/audit-trail');
    expect(
      await screen.findByText('Sign-in refused: the person is not known to Cairn'),
    ).toBeTruthy();
    expect(screen.getAllByText('Refused').some((el) => el.closest('.bp6-tag'))).toBe(true);
    expect(screen.getByText('OV104')).toBeTruthy();
    // People by name (the address they signed in with on hover); unknown addresses as they were.
    expect(screen.getByTitle('imogen@x.example').textContent).toBe('Imogen Varley');
    expect(screen.getByText('sam.ashdown@kettleholm.example')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Show older entries' })).toBeTruthy();
    await userEvent.click(screen.getAllByRole('button', { name: 'Show details' })[0]!);
    expect(await screen.findByText('unknown-user')).toBeTruthy();
    expect(screen.getByText('req-1')).toBeTruthy();
  });
});
