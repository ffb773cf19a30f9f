import { afterEach, describe, expect, it, vi } from 'vitest';
import { stubFetch } from './render';
import {
  alsoActive,
  isCurrent,
  MAX_PLACES,
  navigationFor,
  navigationLayout,
} from '../src/app/navigation';
import { apiFetch } from '../src/lib/api-client';
import type { Me } from '../src/lib/api/types';
import { fetchSession } from '../src/lib/session';

/** The (url, init) pairs fetch was called with. */
const callsOf = (mock: { mock: { calls: unknown[][] } }) =>
  mock.mock.calls as unknown as [RequestInfo, RequestInit | undefined][];

const lead: Me = {
  id: 1,
  email: 'imogen.varley@ostrevale.example',
  displayName: 'Imogen Varley',
  role: 'regional_lead',
  regionName: 'Ostrevale',
  practices: [],
  sessionExpiresAt: '2026-12-01T18:00:00.000Z',
};

afterEach(() => vi.unstubAllGlobals());

describe('session', () => {
  it('sends the session’s CSRF token on state-changing requests only', async () => {
    const fetchMock = stubFetch({
      '/api/session': { body: { user: lead, csrfToken: 'token-123', localSignIn: true } },
      '/api/x': { body: {} },
    });
    await fetchSession();
    await apiFetch('/api/x', { method: 'POST', body: '{}' });
    await apiFetch('/api/x');
    const headers = callsOf(fetchMock).map((call) => new Headers(call[1]?.headers));
    expect(headers[1]!.get('X-CSRF-Token')).toBe('token-123');
    expect(headers[2]!.get('X-CSRF-Token')).toBeNull();
  });

  it('stops sending a token once signed out', async () => {
    const fetchMock = stubFetch({
      '/api/session': { body: { user: null, csrfToken: null } },
      '/api/x': { body: {} },
    });
    await fetchSession();
    await apiFetch('/api/x', { method: 'DELETE' });
    expect(new Headers(callsOf(fetchMock)[1]![1]?.headers).get('X-CSRF-Token')).toBeNull();
  });

  it('shows each role its own navigation: extracts for practice and regional leads, results for practice leads, benchmark and coverage for regional lead and auditor, quarters and measure sets to everyone, reports to practice leads and auditors, outliers to the regional lead and auditor, review cases to everyone, Users and Mail to the regional lead only', () => {
    expect(navigationFor(lead).map((i) => i.label)).toEqual([
      'Home',
      'Upload extract',
      'Submissions',
      'Benchmark',
      'Coverage',
      'Quarters',
      'Measure sets',
      'Users',
      'Mail',
      'Outliers',
      'Review cases',
      'Audit trail',
    ]);
    expect(navigationFor({ ...lead, role: 'auditor' }).map((i) => i.label)).toEqual([
      'Home',
      'Benchmark',
      'Coverage',
      'Quarters',
      'Reports',
      'Measure sets',
      'Outliers',
      'Review cases',
      'Audit trail',
    ]);
    expect(navigationFor({ ...lead, role: 'practice_lead' }).map((i) => i.label)).toEqual([
      'Home',
      'Upload extract',
      'Submissions',
      'Results',
      'Quarters',
      'Reports',
      'Measure sets',
      'Review cases',
    ]);
  });

  it('gathers the regional lead’s Users, Mail and Audit trail into an Admin menu and Upload extract and Submissions into an Extracts menu, so the bar keeps to nine places; other roles keep plain links', () => {
    const places = (me: Me) =>
      navigationLayout(me).map((e) =>
        e.kind === 'link' ? e.item.label : `${e.label}: ${e.items.map((i) => i.label).join(', ')}`,
      );
    expect(places(lead)).toEqual([
      'Home',
      'Extracts: Upload extract, Submissions',
      'Benchmark',
      'Coverage',
      'Quarters',
      'Measure sets',
      'Outliers',
      'Review cases',
      'Admin: Users, Mail, Audit trail',
    ]);
    // The auditor has one administrative entry: no menu for a single link.
    expect(places({ ...lead, role: 'auditor' })).toEqual(
      navigationFor({ ...lead, role: 'auditor' }).map((i) => i.label),
    );
    expect(places({ ...lead, role: 'practice_lead' })).toEqual(
      navigationFor({ ...lead, role: 'practice_lead' }).map((i) => i.label),
    );
    expect(navigationLayout(null)).toEqual([]);
    for (const role of ['regional_lead', 'auditor', 'practice_lead'] as const)
      expect(navigationLayout({ ...lead, role }).length).toBeLessThanOrEqual(MAX_PLACES);
  });

  it('knows which menu entry is the current page, the Mail pages included', () => {
    const mail = navigationFor(lead).find((i) => i.label === 'Mail')!;
    expect(isCurrent(mail, '/deliveries')).toBe(true);
    expect(isCurrent(mail, '/digests')).toBe(true);
    expect(isCurrent(mail, '/mail-recipients')).toBe(true);
    expect(isCurrent(mail, '/users')).toBe(false);
    const home = navigationFor(lead).find((i) => i.label === 'Home')!;
    expect(isCurrent(home, '/')).toBe(true);
    expect(isCurrent(home, '/users')).toBe(false);
  });

  it('keeps Measure sets highlighted on a version’s own page', () => {
    const sets = navigationFor(lead).find((i) => i.label === 'Measure sets')!;
    expect(alsoActive(sets, '/measure-sets/cairn-default-2026.1')).toBe(true);
    expect(alsoActive(sets, '/quarters')).toBe(false);
  });

  it('keeps Submissions highlighted on a submission’s own page, and nothing else', () => {
    const submissions = navigationFor(lead).find((i) => i.label === 'Submissions')!;
    expect(alsoActive(submissions, '/practices/12/submissions/340')).toBe(true);
    expect(alsoActive(submissions, '/practices/12/submissions')).toBe(true);
    expect(alsoActive(submissions, '/practices/12/submissionsx')).toBe(false);
    expect(alsoActive(submissions, '/coverage')).toBe(false);
    const coverage = navigationFor(lead).find((i) => i.label === 'Coverage')!;
    expect(alsoActive(coverage, '/practices/12/submissions/340')).toBe(false);
  });
});
