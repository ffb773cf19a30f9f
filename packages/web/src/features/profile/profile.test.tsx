import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderApp, stubFetch } from '../../../test/render';
import { about } from '../../../test/signed-in';

const priya = {
  id: 3,
  email: 'priya.calloway@quarrybank.example',
  displayName: 'Priya Calloway',
  role: 'practice_lead',
  regionName: 'Ostrevale',
  practices: [{ id: 2, code: 'OV102', name: 'Quarrybank Surgery' }],
};
const preference = (kind: string, label: string, receive: boolean) => ({
  kind,
  label,
  description: `About ${label}`,
  sentTo: ['practice_lead'],
  appliesToYou: true,
  receive,
});

afterEach(() => vi.unstubAllGlobals());

describe('profile', () => {
  it('shows who you are and switches a kind of e-mail off', async () => {
    const fetchMock = stubFetch({
      '/api/about': { body: about },
      '/api/session': { body: { user: priya, csrfToken: 't' } },
      '/api/me/mail-preferences': {
        body: {
          preferences: [
            preference('quarter_opened', 'Audit quarter opened', true),
            preference('deadline_reminder', 'Submission deadline reminders', true),
          ],
        },
      },
    });
    renderApp('/profile');
    expect(await screen.findByText('OV102 · Quarrybank Surgery')).toBeTruthy();
    expect(screen.getAllByText('priya.calloway@quarrybank.example').length).toBeGreaterThan(0);
    const reminders = await screen.findByRole('checkbox', {
      name: 'Submission deadline reminders',
    });
    expect((reminders as HTMLInputElement).checked).toBe(true);
    await userEvent.click(reminders);
    const calls = fetchMock.mock.calls as unknown as [string, RequestInit | undefined][];
    const put = calls.find(([, init]) => init?.method === 'PUT');
    expect(put).toBeTruthy();
    expect(JSON.parse(String(put![1]!.body))).toEqual({
      optedOut: ['deadline_reminder'],
    });
    expect(document.title).toBe('Your profile · Cairn');
  });
});
