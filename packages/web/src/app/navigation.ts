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
export type NavGroupName = 'Admin' | 'Extracts';

/** Most places a navigation bar holds on one row beside the name and sign-out (at 1280 px). */
export const MAX_PLACES = 9;

/** The order in which menus are formed while a role's bar is too long. */
const groupOrder: NavGroupName[] = ['Admin', 'Extracts'];

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
    group: 'Extracts',
  },
  {
    label: 'Submissions',
    to: '/submissions',
    icon: 'list-columns',
    roles: ['practice_lead', 'regional_lead'],
    activeFor: /^\/practices\/[^/]+\/submissions(\/|$)/,
    group: 'Extracts',
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
    group: 'Admin',
  },
  {
    label: 'Mail',
    to: '/deliveries',
    icon: 'envelope',
    roles: ['regional_lead'],
    activeFor: /^\/(deliveries|mail-recipients|digests)(\/|$)/,
    group: 'Admin',
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
    group: 'Admin',
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
 * The navigation bar of a role: its items in order, one place each, while they fit on one row
 * (`MAX_PLACES`). A longer bar gathers menus, in `groupOrder`, until it fits: the regional lead's
 * Users, Mail and Audit trail become Admin, then Upload extract and Submissions become
 * Extracts. A menu takes the place of its last item. Shorter bars (the auditor's, a practice
 * lead's) keep plain links.
 */
export function navigationLayout(me: Me | null | undefined): NavEntry[] {
  const items = navigationFor(me);
  const gathered = new Set<NavGroupName>();
  const places = () =>
    items.filter((item) => !item.group || !gathered.has(item.group)).length + gathered.size;
  for (const group of groupOrder) {
    if (places() <= MAX_PLACES) break;
    if (items.filter((item) => item.group === group).length > 1) gathered.add(group);
  }
  const entries: NavEntry[] = [];
  items.forEach((item, i) => {
    if (!item.group || !gathered.has(item.group)) {
      entries.push({ kind: 'link', item });
      return;
    }
    const members = items.filter((other) => other.group === item.group);
    // The menu stands where its last item would.
    if (members.at(-1) === items[i])
      entries.push({ kind: 'group', label: item.group, items: members });
  });
  return entries;
}

/** Whether `pathname` belongs to `item` (its own address, or one it is also active for). */
export function isCurrent(item: NavItem, pathname: string): boolean {
  const own =
    item.to === '/' ? pathname === '/' : pathname === item.to || pathname.startsWith(`${item.to}/`);
  return own || alsoActive(item, pathname);
}
