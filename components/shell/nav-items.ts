import type { Role } from '@/lib/domain';

export type NavItem = { href: string; label: string; roles: Role[] | 'all' };

// Our own section names (see PRODUCT.md); who sees each one.
export const NAV: NavItem[] = [
  { href: '/today', label: 'Today', roles: 'all' },
  { href: '/scan', label: 'Scan', roles: 'all' },
  { href: '/bench-check', label: 'Bench check', roles: 'all' },
  { href: '/shelf', label: 'Shelf', roles: 'all' },
  { href: '/kits', label: 'Kits', roles: 'all' },
  { href: '/loans', label: 'Loans', roles: 'all' },
  { href: '/signoffs', label: 'Sign-offs', roles: 'all' },
  { href: '/counter', label: 'Counter', roles: ['member', 'steward'] },
  { href: '/orders', label: 'Restock', roles: ['steward', 'admin'] },
  { href: '/books', label: 'Books', roles: ['treasurer'] },
  { href: '/people', label: 'People', roles: ['admin'] },
  { href: '/settings', label: 'Settings', roles: ['admin'] },
];

export function navFor(roles: Role[]): NavItem[] {
  return NAV.filter((n) => n.roles === 'all' || n.roles.some((r) => roles.includes(r)));
}

// On a phone the bar at the bottom holds the four sections used most at the bench; "More" lists them all.
const PHONE_ORDER = [
  '/today',
  '/scan',
  '/loans',
  '/counter',
  '/books',
  '/people',
  '/shelf',
  '/orders',
  '/kits',
  '/signoffs',
  '/bench-check',
  '/settings',
];
export const PHONE_BAR_SIZE = 4;

// A section the order does not name ranks after every named one (indexOf's -1 once put Sign-offs first).
const rank = (href: string) => {
  const i = PHONE_ORDER.indexOf(href);
  return i === -1 ? PHONE_ORDER.length : i;
};

export function phoneBar(items: NavItem[]): NavItem[] {
  return [...items].sort((a, b) => rank(a.href) - rank(b.href)).slice(0, PHONE_BAR_SIZE);
}
