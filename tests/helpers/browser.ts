import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { afterEach } from 'vitest';
import { DEMO_PASSWORD } from '@/db/seed/people';
import { BASE } from './http';

// Debian's Chromium driven by playwright-core; never a downloaded browser.
export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-quic',
      '--no-first-run',
      '--disable-sync',
    ],
  });
}

// Every page runs under the app's Content-Security-Policy; a violation anywhere fails the test that
// caused it. The listener is injected by the browser driver (not subject to the page's CSP).
const cspViolations: string[] = [];
afterEach(() => {
  const found = cspViolations.splice(0);
  if (found.length) throw new Error(`Content-Security-Policy violations:\n  ${found.join('\n  ')}`);
});

/** A fresh context at phone width (390 px) by default; `storageState` carries another context's sign-in. */
export async function newPage(
  browser: Browser,
  width = 390,
  height = 844,
  storageState?: Awaited<ReturnType<BrowserContext['storageState']>>,
): Promise<Page> {
  const context = await browser.newContext({ viewport: { width, height }, baseURL: BASE, storageState });
  await context.exposeBinding('__ohmCspViolation', (_source, text: string) => {
    cspViolations.push(text);
  });
  await context.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      const w = window as unknown as { __ohmCspViolation: (t: string) => void };
      void w.__ohmCspViolation(
        `${e.violatedDirective} blocked ${e.blockedURI || '(inline)'} on ${location.pathname}`,
      );
    });
  });
  return context.newPage();
}

/** The violations seen so far and not yet reported (a test may check a page explicitly). */
export function takeCspViolations(): string[] {
  return cspViolations.splice(0);
}

export async function signInPage(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto('/signin');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/signin'));
}

const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

/** axe-core in the page; returns the serious and critical violations (ids and first targets). */
export async function seriousA11yViolations(page: Page): Promise<string[]> {
  // A refresh after a server action streams the page's metadata again; give the <title> a moment to
  // come back before judging (a page that never has one still fails below).
  await page.waitForFunction(() => document.title.trim() !== '', null, { timeout: 5_000 }).catch(() => undefined);
  // Evaluated by the driver, not added as an inline <script> (the app's CSP refuses those).
  await page.evaluate(axeSource);
  const violations = await page.evaluate(async () => {
    // @ts-expect-error axe is injected above
    const r = await window.axe.run(document, { resultTypes: ['violations'] });
    return r.violations as { id: string; impact: string; nodes: { target: string[] }[] }[];
  });
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map(
      (v) =>
        `${v.id}: ${v.nodes
          .slice(0, 3)
          .map((n) => n.target.join(' '))
          .join(', ')}`,
    );
}

/** True when the page does not scroll sideways at its viewport width. */
export async function fitsWidth(page: Page): Promise<boolean> {
  return page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth + 1);
}

/** The WCAG 2.x level A and AA rules (2.2 included) of axe-core. */
export const WCAG_AA_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22a', 'wcag22aa'];

/** The rules whose outcome depends on colours alone (what a change of colour scheme can break). */
export const COLOUR_RULES = ['color-contrast', 'link-in-text-block'];

/** Puts axe-core into every page of the context before the page's own scripts (saves a round trip per page). */
export async function preloadAxe(context: BrowserContext): Promise<void> {
  await context.addInitScript({ content: axeSource });
}

/**
 * Every axe-core violation of the WCAG A/AA rules (2.2 included), whatever its impact (ids, first targets
 * and why); `only: 'colours'` runs just the rules a change of colour scheme can affect.
 */
export async function wcagViolations(page: Page, only?: 'colours'): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(axeSource);
  const runOnly = only ? { type: 'rule', values: COLOUR_RULES } : { type: 'tag', values: WCAG_AA_TAGS };
  const violations = await page.evaluate(async (runOnly) => {
    // @ts-expect-error axe is injected above
    const r = await window.axe.run(document, { runOnly, resultTypes: ['violations'] });
    return r.violations as { id: string; nodes: { target: string[]; failureSummary?: string }[] }[];
  }, runOnly);
  return violations.map(
    (v) =>
      `${v.id}: ${v.nodes
        .slice(0, 3)
        .map(
          (n) =>
            `${n.target.join(' ')} (${(n.failureSummary ?? '').split('\n').slice(1, 2).join('').trim()})`,
        )
        .join(', ')}`,
  );
}

/**
 * Waits until CSS transitions and animations have finished (a change of colour scheme fades the buttons).
 * Only those on rendered elements: Chromium does not advance a transition inside a closed <details> (its
 * content is skipped from rendering), so its `finished` never settles — that hung a page with buttons in a
 * folded section for the whole test timeout. A cap of two seconds guards against any other such case.
 */
export async function settled(page: Page): Promise<void> {
  await page.evaluate(() =>
    Promise.race([
      Promise.all(
        document
          .getAnimations()
          .filter((a) => {
            const target = (a.effect as KeyframeEffect | null)?.target;
            return !target || target.checkVisibility();
          })
          .map((a) => a.finished.catch(() => undefined)),
      ),
      new Promise((resolve) => setTimeout(resolve, 2_000)),
    ]),
  );
}
