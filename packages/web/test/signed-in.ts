/**
 * What every page asks for first, answered for a page test: Cairn's about (the demo region,
 * Ostrevale), the session of a person of the given role, and the audit quarters (the API's own
 * answer over the demo region); then the page's own routes.
 */
import type { Me } from '../src/lib/api/types';
import quarters from './fixtures/quarters.json';
import { type Route, stubRoutes } from './route-stub';

export const about = {
  product: 'Cairn',
  version: '0.1.0',
  regionName: 'Ostrevale',
  practices: 30,
  localities: 4,
  clinicalCaution: 'x',
};

/** Someone of `role`; a practice lead leads OV102. */
export const person = (role: Me['role']): Me => ({
  id: 1,
  email: 'someone@x.example',
  displayName: 'Someone',
  role,
  regionName: 'Ostrevale',
  practices: role === 'practice_lead' ? [{ id: 2, code: 'OV102', name: 'Quarrybank Surgery' }] : [],
  sessionExpiresAt: '2026-12-05T06:57:32.717Z',
});

export function stubSignedIn(role: Me['role'], routes: Record<string, Route> = {}) {
  return stubRoutes({
    'GET /api/about': { body: about },
    'GET /api/session': { body: { user: person(role), csrfToken: 'tok' } },
    'GET /api/quarters': { body: quarters },
    ...routes,
  });
}
