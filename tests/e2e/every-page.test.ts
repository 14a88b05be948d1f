import { readdirSync } from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { closeTestDb, testDb } from '../helpers/db';
import { launchBrowser, newPage, preloadAxe, settled, signInPage, wcagViolations } from '../helpers/browser';

// Every page of the app, for every demo role of Quillmere Makers (db/seed/people.ts) and for an anonymous
// visitor, at a phone's width (390 px) and a desk's (1280 px), in the light and the dark colour scheme.
// A page fails on: a document wider than the viewport, any console error or uncaught error, any axe-core
// violation of the WCAG 2.x A/AA rules (2.2 included), or a primary action reaching outside the viewport.
// The list of pages is read from app/**/page.tsx, so a new page is visited without editing this file
// (a new dynamic segment needs a concrete id below, or the listing test fails).
// Speed: one browser, one context per person, one navigation per page; the four views are made by resizing
// and switching the emulated colour scheme. At each width axe runs all WCAG A/AA rules in the light scheme
// and, in the dark one, the rules a colour scheme can change (contrast of text, links and controls).

const APP = path.resolve(__dirname, '../../app');
const WIDTHS = [390, 1280] as const;
const SCHEMES = ['light', 'dark'] as const;

/** App Router route patterns of every page file: `(group)` folders dropped, `[id]` kept. */
export function pagePatterns(dir = APP, rel = ''): string[] {
  const out: string[] = [];
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    if (e.isDirectory()) {
      if (e.name === 'api' || e.name.startsWith('_')) continue;
      const seg = e.name.startsWith('(') ? '' : `/${e.name}`;
      out.push(...pagePatterns(path.join(dir, e.name), rel + seg));
    } else if (e.name === 'page.tsx') out.push(rel || '/');
  }
  return out.sort();
}

const db = testDb();
type Ids = Record<string, string>;
let ids: Ids;

/** The seeded demo's rows that stand in for each dynamic segment (and the query a page needs). */
async function demoIds(): Promise<Ids> {
  const space = await db
    .selectFrom('spaces')
    .select('id')
    .where('slug', '=', 'quillmere')
    .executeTakeFirstOrThrow();
  const s = space.id;
  const one = async <T extends 'parts' | 'locations' | 'kit_boxes' | 'kit_templates' | 'loans' | 'sales'>(
    table: T,
  ) =>
    (
      await db
        .selectFrom(table as 'parts')
        .select('id')
        .where('space_id', '=', s)
        .orderBy('created_at')
        .executeTakeFirstOrThrow()
    ).id;
  const juniper = await db
    .selectFrom('users')
    .select('id')
    .where('email', '=', 'juniper@quillmere.example')
    .executeTakeFirstOrThrow();
  const memberLoan = await db
    .selectFrom('loans')
    .select('id')
    .where('space_id', '=', s)
    .where('borrower_id', '=', juniper.id)
    .orderBy('created_at')
    .executeTakeFirst();
  // The payment page shows a sale to its buyer and to staff: one of the member's own.
  const memberSale = await db
    .selectFrom('sales')
    .select('id')
    .where('space_id', '=', s)
    .where('buyer_id', '=', juniper.id)
    .orderBy('created_at')
    .executeTakeFirstOrThrow();
  const part = await db
    .selectFrom('parts')
    .select(['id', 'code'])
    .where('space_id', '=', s)
    .where('code', 'is not', null)
    .orderBy('created_at')
    .executeTakeFirstOrThrow();
  return {
    part: part.id,
    partCode: part.code!,
    location: await one('locations'),
    box: await one('kit_boxes'),
    template: await one('kit_templates'),
    loan: await one('loans'),
    memberLoan: memberLoan?.id ?? (await one('loans')),
    sale: await one('sales'),
    memberSale: memberSale.id,
    order: (await db.selectFrom('order_lists').select('id').where('space_id', '=', s).orderBy('created_at').executeTakeFirstOrThrow()).id,
  };
}

type Who = 'anonymous' | 'member' | 'steward' | 'treasurer' | 'admin';

/** A concrete address for a route pattern, as this person would open it. */
function concrete(pattern: string, who: Who): string | null {
  const map: Record<string, string> = {
    '/books/sales/[id]': `/books/sales/${ids.sale}`,
    '/kits/boxes/[id]': `/kits/boxes/${ids.box}`,
    '/kits/templates/[id]': `/kits/templates/${ids.template}`,
    '/kits/templates/[id]/edit': `/kits/templates/${ids.template}/edit`,
    '/loans/[id]': `/loans/${who === 'member' ? ids.memberLoan : ids.loan}`,
    '/shelf/locations/[id]': `/shelf/locations/${ids.location}`,
    '/orders/[id]': `/orders/${ids.order}`,
    '/shelf/parts/[id]': `/shelf/parts/${ids.part}`,
    '/shelf/parts/[id]/edit': `/shelf/parts/${ids.part}/edit`,
    '/s/[code]': `/s/${ids.partCode}`,
    '/counter/done': `/counter/done?sale=${ids.memberSale}`,
    '/signin/link': `/signin/link?token=${'Z'.repeat(43)}`,
    '/welcome': `/welcome?token=${'Z'.repeat(43)}`,
  };
  if (pattern in map) return map[pattern];
  return pattern.includes('[') ? null : pattern;
}

// Pages anyone may open; the rest send an anonymous visitor to sign-in.
const PUBLIC = ['/', '/bench-check', '/forbidden', '/signin', '/signin/link', '/welcome'];
const PEOPLE: { who: Who; email: string | null }[] = [
  { who: 'anonymous', email: null },
  { who: 'member', email: 'juniper@quillmere.example' },
  { who: 'steward', email: 'tobiah@quillmere.example' },
  { who: 'treasurer', email: 'marisol@quillmere.example' },
  { who: 'admin', email: 'perpetua@quillmere.example' },
];

/** What is wrong with the page as it is now laid out (no navigation). */
async function layoutProblems(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const out: string[] = [];
    const doc = document.documentElement;
    if (doc.scrollWidth > doc.clientWidth)
      out.push(`document is ${doc.scrollWidth - doc.clientWidth} px wider than the viewport`);
    for (const el of document.querySelectorAll<HTMLElement>('.btn-primary, [data-primary]')) {
      const r = el.getBoundingClientRect();
      if (!el.checkVisibility() || r.width === 0) continue;
      if (r.left < 0 || r.right > doc.clientWidth + 0.5)
        out.push(
          `primary action "${(el.innerText || el.getAttribute('aria-label') || '').trim()}" spans ${Math.round(r.left)}–${Math.round(r.right)} px`,
        );
    }
    return out;
  });
}

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
  ids = await demoIds();
});
afterAll(async () => {
  await browser?.close();
  await closeTestDb();
});

test('every page file has a concrete address to visit', () => {
  const patterns = pagePatterns();
  expect(patterns.length).toBeGreaterThan(30);
  expect(patterns.filter((p) => concrete(p, 'admin') === null)).toEqual([]);
});

/** Each person's own sections: always visited. */
const OWN: Record<Who, string[]> = {
  anonymous: ['/', '/signin', '/bench-check'],
  member: ['/today', '/scan', '/shelf', '/kits', '/loans', '/counter'],
  steward: ['/today', '/shelf', '/shelf/counts', '/shelf/receive', '/loans/round', '/counter'],
  treasurer: ['/today', '/books', '/books/sales/[id]'],
  admin: ['/today', '/people', '/settings', '/loans/round'],
};
// Every page × every person × both widths × both schemes with axe takes about twenty minutes on two cores,
// past CI's budget: `npm test` visits each person's own sections in all four views, and
// `OHM_EVERY_PAGE=all npm test -- tests/e2e/every-page.test.ts` visits every page.
const EVERY_PAGE = process.env.OHM_EVERY_PAGE === 'all';

describe.each(PEOPLE)('$who', ({ who, email }) => {
  let page: Page;
  const errors: string[] = [];
  const visited: string[] = [];

  beforeAll(async () => {
    ids ??= await demoIds();
    page = await newPage(browser, 390, 844);
    await preloadAxe(page.context());
    page.on('console', (m) => {
      if (m.type() === 'error') errors.push(`console: ${m.text()}`);
    });
    page.on('pageerror', (e) => errors.push(`uncaught: ${e.message}`));
    if (email) await signInPage(page, email);
  });
  afterAll(async () => {
    await page?.context().close();
  });

  const patterns = pagePatterns()
    .filter((p) => (who === 'anonymous' ? PUBLIC.includes(p) : p !== '/'))
    .filter((p) => EVERY_PAGE || OWN[who].includes(p));
  test.each(patterns)('%s', async (pattern) => {
    const href = concrete(pattern, who);
    expect(href, `a concrete address for ${pattern}`).not.toBeNull();
    errors.length = 0;
    await page.setViewportSize({ width: 390, height: 844 });
    await page.emulateMedia({ colorScheme: 'light' });
    const response = await page.goto(href!, { waitUntil: 'load' });
    // Client-side data settles; a page that keeps polling (a payment's status) is checked as it stands.
    await page.waitForLoadState('networkidle', { timeout: 5_000 }).catch(() => undefined);
    // A refusal that reaches the browser after the page began to stream (a loading boundary) arrives as a
    // client-side redirect: wait until the address has held for a moment before judging the page.
    let landed = new URL(page.url()).pathname;
    for (let i = 0; i < 20; i++) {
      await page.waitForTimeout(400);
      await page.waitForLoadState('load');
      const now = new URL(page.url()).pathname;
      if (now === landed) break;
      landed = now;
    }
    // A page this role may not open sends them to /forbidden, which is visited on its own.
    if (landed === '/forbidden' && pattern !== '/forbidden') return;
    // The first-run page exists only until the first space does; in the demo it is a plain 404 page.
    if (pattern === '/first-run') {
      expect(response?.status()).toBe(404);
      expect(errors.filter((e) => !/status of 404/.test(e))).toEqual([]);
      errors.length = 0;
    }
    visited.push(pattern);
    const problems: string[] = [];
    for (const width of WIDTHS) {
      await page.setViewportSize({ width, height: width < 600 ? 844 : 900 });
      for (const scheme of SCHEMES) {
        await page.emulateMedia({ colorScheme: scheme });
        await settled(page);
        const where = `${width} px ${scheme}`;
        for (const p of await layoutProblems(page)) problems.push(`${where}: ${p}`);
        const rules = scheme === 'light' ? undefined : 'colours';
        for (const v of await wcagViolations(page, rules)) problems.push(`${where}: axe ${v}`);
      }
    }
    for (const e of errors) problems.push(e);
    expect(problems, `${href} as ${who} (landed on ${landed})`).toEqual([]);
  });

  test('opened the pages of its own sections', () => {
    for (const p of OWN[who]) expect(visited, p).toContain(p);
  });
});
