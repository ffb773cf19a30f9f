import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { navigationFor } from '../src/app/navigation';
import type { Me } from '../src/lib/api/types';
import { renderApp, stubFetch } from './render';
import { about } from './signed-in';

const practiceLead: Me = {
  id: 7,
  email: 'lead@example.test',
  displayName: 'Pat Lead',
  role: 'practice_lead',
  regionName: 'Ostrevale',
  practices: [{ id: 1, code: 'OV101', name: 'Wrenfield Health Centre' }],
  sessionExpiresAt: '2026-12-01T18:00:00.000Z',
};

afterEach(() => vi.unstubAllGlobals());

describe('web shell', () => {
  it('shows the landing page with a sign-in link when nobody is signed in', async () => {
    stubFetch({ '/api/about': { body: about }, '/api/session': { body: { user: null } } });
    renderApp('/');
    expect(await screen.findByRole('heading', { level: 1, name: 'Cairn' })).toBeTruthy();
    expect(await screen.findByText('30 practices in 4 localities take part.')).toBeTruthy();
    expect(screen.getAllByRole('button', { name: /Sign in/ }).length).toBeGreaterThan(0);
    // The caution once on the page (the landing page's own), not again in the footer.
    expect(screen.getAllByText(/not clinical advice/)).toHaveLength(1);
    expect(document.title).toBe('Cairn');
  });

  it('keeps the sign-in page to one way in: no Sign in button in its header', async () => {
    stubFetch({ '/api/about': { body: about }, '/api/session': { body: { user: null } } });
    renderApp('/sign-in');
    expect(await screen.findByRole('heading', { level: 1, name: 'Sign in to Cairn' })).toBeTruthy();
    expect(screen.getByRole('banner').querySelector('a[href="/sign-in"]')).toBeNull();
    expect(screen.getAllByRole('heading', { level: 1 })).toHaveLength(1);
    await waitFor(() => expect(document.title).toBe('Sign in · Cairn'));
  });

  it('greets a signed-in practice lead with their role and practices', async () => {
    stubFetch({ '/api/about': { body: about }, '/api/session': { body: { user: practiceLead } } });
    renderApp('/');
    expect(
      await screen.findByRole('heading', { level: 1, name: 'Welcome, Pat Lead' }),
    ).toBeTruthy();
    expect(screen.getByRole('heading', { name: /Wrenfield Health Centre/ })).toBeTruthy();
    await waitFor(() => expect(document.title).toBe('Home · Cairn'));
    expect(screen.getByRole('button', { name: /Sign out/ })).toBeTruthy();
  });

  it('renders the 404 page for an unknown route', async () => {
    stubFetch({ '/api/about': { body: about }, '/api/session': { body: { user: null } } });
    renderApp('/nothing/here');
    expect(
      await screen.findByRole('heading', { level: 1, name: 'This page does not exist' }),
    ).toBeTruthy();
    expect(screen.getByText('/nothing/here')).toBeTruthy();
    await waitFor(() => expect(document.title).toBe('Page not found · Cairn'));
  });

  it('explains a failed session check instead of showing a blank page', async () => {
    stubFetch({
      '/api/about': { body: about },
      '/api/session': {
        status: 503,
        body: {
          type: '/api/problems/unhealthy',
          title: 'Cairn is not healthy',
          status: 503,
          detail: 'The database does not answer.',
        },
      },
    });
    renderApp('/');
    expect(
      await screen.findByText('Cairn could not check your sign-in', {}, { timeout: 5000 }),
    ).toBeTruthy();
    expect(screen.getByText(/The database does not answer/)).toBeTruthy();
  });

  it('toggles the dark theme and remembers the choice', async () => {
    stubFetch({ '/api/about': { body: about }, '/api/session': { body: { user: null } } });
    renderApp('/');
    await userEvent.click(await screen.findByRole('button', { name: 'Use the dark theme' }));
    await waitFor(() => expect(document.body.classList.contains('bp6-dark')).toBe(true));
    expect(localStorage.getItem('cairn.theme')).toBe('dark');
    await userEvent.click(screen.getByRole('button', { name: 'Use the light theme' }));
    await waitFor(() => expect(document.body.classList.contains('bp6-dark')).toBe(false));
  });

  it('builds navigation from the role', () => {
    expect(navigationFor(null)).toEqual([]);
    expect(navigationFor(practiceLead).map((i) => i.label)).toContain('Home');
  });
});
