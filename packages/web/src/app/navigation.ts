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
  /** A menu this item joins when the role sees two or more of that menu's items */
  group?: NavGroupName;
}

/** The menus that gather several items, so that a long navigation keeps to one row. */
export type NavGroupName = 'Administration';

/** One place in the navigation bar: a link, or a menu of links. */
export type NavEntry =
  { kind: 'link'; item: NavItem } | { kind: 'group'; label: NavGroupName; items: NavItem[] };

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
  {
    label: 'Users',
    to: '/users',
    icon: 'people',
    roles: ['regional_lead'],
    group: 'Administration',
  },
  {
    label: 'Mail',
    to: '/deliveries',
    icon: 'envelope',
    roles: ['regional_lead'],
    activeFor: /^\/(deliveries|mail-recipients|digests)(\/|$)/,
    group: 'Administration',
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
    group: 'Administration',
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

/**
 * The navigation bar of a role: its items in order, except that items of a menu the role sees
 * two or more of are gathered into that menu, placed after the other entries (the auditor's one
 * administrative item, Audit trail, stays a plain link).
 */
export function navigationLayout(me: Me | null | undefined): NavEntry[] {
  const items = navigationFor(me);
  const size = new Map<NavGroupName, number>();
  for (const item of items) if (item.group) size.set(item.group, (size.get(item.group) ?? 0) + 1);
  const grouped = (item: NavItem) => item.group != null && (size.get(item.group) ?? 0) > 1;
  const entries: NavEntry[] = items
    .filter((item) => !grouped(item))
    .map((item) => ({ kind: 'link', item }));
  for (const [label] of size) {
    const members = items.filter((item) => item.group === label && grouped(item));
    if (members.length > 0) entries.push({ kind: 'group', label, items: members });
  }
  return entries;
}

/** Whether `pathname` belongs to `item` (its own address, or one it is also active for). */
export function isCurrent(item: NavItem, pathname: string): boolean {
  const own =
    item.to === '/' ? pathname === '/' : pathname === item.to || pathname.startsWith(`${item.to}/`);
  return own || alsoActive(item, pathname);
}
