import { describe, expect, test } from 'vitest';
import { NAV, navFor, phoneBar, PHONE_BAR_SIZE } from '@/components/shell/nav-items';
import type { Role } from '@/lib/domain';

// The phone's bottom bar: the sections used most at the bench, in the house's order; a section the order
// does not name (a new one) goes to "More", never to the front of the bar.
describe('phone bar', () => {
  const bar = (roles: Role[]) => phoneBar(navFor(roles)).map((n) => n.href);

  test('a member keeps Today, Scan, Loans and Counter', () => {
    expect(bar(['member'])).toEqual(['/today', '/scan', '/loans', '/counter']);
  });

  test('a treasurer keeps Books on the bar', () => {
    expect(bar(['treasurer'])).toEqual(['/today', '/scan', '/loans', '/books']);
  });

  test('an admin keeps People on the bar', () => {
    expect(bar(['admin'])).toEqual(['/today', '/scan', '/loans', '/people']);
  });

  test('a section the order does not name never takes a place on the bar', () => {
    const extra = { href: '/somewhere-new', label: 'New', roles: 'all' as const };
    const items = [extra, ...navFor(['member'])];
    expect(phoneBar(items).map((n) => n.href)).not.toContain('/somewhere-new');
    expect(phoneBar(items)).toHaveLength(PHONE_BAR_SIZE);
  });

  test('every section is either on the bar or in More, none twice', () => {
    for (const roles of [['member'], ['steward'], ['treasurer'], ['admin']] as Role[][]) {
      const all = navFor(roles).map((n) => n.href);
      expect(new Set(all).size).toBe(all.length);
      for (const href of bar(roles)) expect(all).toContain(href);
    }
    expect(NAV.length).toBeGreaterThan(PHONE_BAR_SIZE);
  });
});
