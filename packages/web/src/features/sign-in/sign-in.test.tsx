import { screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderApp, stubFetch } from '../../../test/render';
import { about } from '../../../test/signed-in';

afterEach(() => vi.unstubAllGlobals());

describe('sign-in page', () => {
  it('starts SP-initiated sign-in, coming back to the page asked for', async () => {
    stubFetch({
      '/api/about': { body: about },
      '/api/session': { body: { user: null, csrfToken: null, localSignIn: true } },
    });
    renderApp('/sign-in?returnTo=%2Fusers%3Frole%3Dauditor');
    const button = await screen.findByRole('button', {
      name: "Continue to your organisation's sign-in",
    });
    expect(button.getAttribute('href')).toBe(
      '/api/auth/saml/login?returnTo=%2Fusers%3Frole%3Dauditor',
    );
    expect(await screen.findByText('Local setup')).toBeTruthy();
  });

  it('explains a refused sign-in in plain words, with its reference', async () => {
    stubFetch({
      '/api/about': { body: about },
      '/api/session': { body: { user: null, csrfToken: null } },
    });
    renderApp('/sign-in?refused=deactivated');
    expect(await screen.findByText('Your Cairn account has been deactivated')).toBeTruthy();
    expect(screen.getByText(/ask your regional lead to reactivate/)).toBeTruthy();
    // The reference is kept for support, folded away.
    const support = screen.getByText('Details for support').closest('details')!;
    expect(support.textContent).toBe('Details for supportReference: deactivated');
    expect(screen.getByRole('button', { name: 'Sign in again' })).toBeTruthy();
  });

  it('gives every security refusal the same careful explanation', async () => {
    stubFetch({
      '/api/about': { body: about },
      '/api/session': { body: { user: null, csrfToken: null } },
    });
    renderApp('/sign-in?refused=signature-invalid');
    expect(await screen.findByText('Cairn could not verify this sign-in')).toBeTruthy();
  });

  it('confirms a sign-out, and says why a session ended', async () => {
    stubFetch({
      '/api/about': { body: about },
      '/api/session': { body: { user: null, csrfToken: null } },
    });
    renderApp('/sign-in?signedOut=1');
    expect(await screen.findByText('You have signed out of Cairn')).toBeTruthy();
    vi.unstubAllGlobals();
    stubFetch({
      '/api/about': { body: about },
      '/api/session': { body: { user: null, csrfToken: null, sessionEnded: 'idle' } },
    });
    renderApp('/sign-in');
    expect(await screen.findByText(/ended after a while without activity/)).toBeTruthy();
  });

  it('tells a signed-in person who they are instead of offering sign-in', async () => {
    stubFetch({
      '/api/about': { body: about },
      '/api/session': {
        body: {
          user: {
            id: 2,
            email: 't@x.example',
            displayName: 'Tobias Renwick',
            role: 'auditor',
            regionName: 'Ostrevale',
            practices: [],
          },
          csrfToken: 't',
        },
      },
    });
    renderApp('/sign-in');
    expect(await screen.findByText('Tobias Renwick', { selector: 'strong' })).toBeTruthy();
    expect(
      screen.queryByRole('button', { name: "Continue to your organisation's sign-in" }),
    ).toBeNull();
  });
});
