import type { IconName } from '@blueprintjs/icons';
import { type Me, type Role, roleValues } from '../lib/api/types';

export interface NavItem {
  label: string;
  to: string;
  icon: IconName;
  /** Roles that see this item */
  roles: readonly Role[];
  /** Other addresses that belong to this item (a submission page belongs to Submissions) */
  activeFor?: RegExp;
}

const everyone: readonly Role[] = roleValues;

/**
 * Navigation, by role. A feature adds its entry here when its screens exist;
 * the server decides what each role may read, this only decides what is shown.
 */
export const navItems: NavItem[] = [
  { label: 'Home', to: '/', icon: 'home', roles: everyone },
  {
    label: 'Upload extract',
    to: '/extracts/upload',
    icon: 'upload',
    roles: ['practice_lead', 'regional_lead'],
  },
  {
    label: 'Submissions',
    to: '/submissions',
    icon: 'list-columns',
    roles: ['practice_lead', 'regional_lead'],
    activeFor: /^\/practices\/[^/]+\/submissions(\/|$)/,
  },
  {
    label: 'Results',
    to: '/results',
    icon: 'timeline-bar-chart',
    roles: ['practice_lead'],
    activeFor: /^\/practices\/[^/]+\/results(\/|$)/,
  },
  {
    label: 'Benchmark',
    to: '/benchmark',
    icon: 'scatter-plot',
    roles: ['regional_lead', 'auditor'],
    activeFor: /^\/practices\/[^/]+\/results(\/|$)/,
  },
  { label: 'Coverage', to: '/coverage', icon: 'grid-view', roles: ['regional_lead', 'auditor'] },
  { label: 'Quarters', to: '/quarters', icon: 'calendar', roles: everyone },
  // The regional lead reaches reports from each audit quarter (their navigation is full).
  {
    label: 'Reports',
    to: '/reports',
    icon: 'document',
    roles: ['practice_lead', 'auditor'],
    activeFor: /^\/reports\//,
  },
  {
    label: 'Measure sets',
    to: '/measure-sets',
    icon: 'properties',
    roles: everyone,
    activeFor: /^\/measure-sets\//,
  },
  { label: 'Users', to: '/users', icon: 'people', roles: ['regional_lead'] },
  {
    label: 'Mail',
    to: '/deliveries',
    icon: 'envelope',
    roles: ['regional_lead'],
    activeFor: /^\/(deliveries|mail-recipients|digests)(\/|$)/,
  },
  {
    label: 'Outliers',
    to: '/outliers',
    icon: 'scatter-plot',
    roles: ['regional_lead', 'auditor'],
  },
  {
    label: 'Review cases',
    to: '/review-cases',
    icon: 'search-template',
    roles: everyone,
    activeFor: /^\/review-cases\//,
  },
  {
    label: 'Audit trail',
    to: '/audit-trail',
    icon: 'history',
    roles: ['regional_lead', 'auditor'],
  },
];

/** Whether `item` is the current section for `pathname`, beyond its own address. */
export function alsoActive(item: NavItem, pathname: string): boolean {
  return item.activeFor?.test(pathname) ?? false;
}

export function navigationFor(me: Me | null | undefined): NavItem[] {
  if (!me) return [];
  return navItems.filter((item) => item.roles.includes(me.role));
}
