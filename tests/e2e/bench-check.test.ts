import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { fitsWidth, launchBrowser, newPage } from '../helpers/browser';

// /bench-check in Debian Chromium at phone width (390 px), signed out. A bad value marks its own field
// with a message and the page and every other input stay; the Heat panel says which sink a build needs.

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const input = (page: Page, name: string) => page.locator(`input[data-field="${name}"]`);
const errorFor = (page: Page, name: string) => page.locator(`[data-error-for="${name}"]`);

async function openCheck(scheme: 'light' | 'dark' = 'light'): Promise<Page> {
  const page = await newPage(browser);
  await page.emulateMedia({ colorScheme: scheme });
  await page.goto('/bench-check');
  await page.evaluate(() => sessionStorage.clear());
  await page.reload();
  await page.getByRole('heading', { name: 'Bench check', level: 1 }).waitFor();
  await page.locator('[data-verdict]').first().waitFor();
  return page;
}

/** Values typed before the bad one, which must survive it. */
const KEPT = { 'string.count': '4', 'buck.outputMilliamps': '300', 'supply.maxAmps': '2,5' } as const;

describe('bench check at 390 px: a bad value marks its field and keeps the rest', () => {
  test.each([
    ['1e308', /cannot be more than 1000 V/i],
    ['-5', /greater than 0/i],
    ['twelve', /enter a number/i],
    ['', /required/i],
  ])('supply voltage %j', async (typed, message) => {
    const page = await openCheck();
    for (const [name, value] of Object.entries(KEPT)) await input(page, name).fill(value);
    await input(page, 'supply.volts').fill(typed);

    await expect.poll(() => errorFor(page, 'supply.volts').textContent()).toMatch(message);
    expect(await input(page, 'supply.volts').getAttribute('aria-invalid')).toBe('true');
    expect(await input(page, 'supply.volts').inputValue()).toBe(typed); // what was typed stays to be fixed
    for (const [name, value] of Object.entries(KEPT))
      expect(await input(page, name).inputValue()).toBe(value);
    expect(await page.locator('[data-error-for]').count()).toBe(1); // only the bad field is marked
    // The page stands: its title, the form, and a results card that says what it waits for.
    expect(await page.getByRole('heading', { name: 'Bench check', level: 1 }).isVisible()).toBe(true);
    expect(await page.locator('[data-waiting]').isVisible()).toBe(true);
    expect(await page.getByText(/hit a problem/i).count()).toBe(0);

    // Fixing the field brings the check back with the other values as they were.
    await input(page, 'supply.volts').fill('24');
    await page.locator('#bench-results [data-verdict]').first().waitFor();
    expect(await errorFor(page, 'supply.volts').count()).toBe(0);
    await page.context().close();
  });

  test('a comma decimal is accepted and echoed as read', async () => {
    const page = await openCheck();
    await input(page, 'string.vfTyp').fill('3,2');
    await expect.poll(() => page.locator('[data-echo-for="string.vfTyp"]').textContent()).toBe('read as 3.2');
    expect(await errorFor(page, 'string.vfTyp').count()).toBe(0);
    await page.locator('#bench-results [data-check="led-power"]').waitFor();
    await page.context().close();
  });

  test('kHz and µH are echoed in hertz and henries; hertz typed into the kHz field is caught', async () => {
    const page = await openCheck();
    await input(page, 'buck.inductorMicrohenries').fill('68');
    await input(page, 'buck.switchingKilohertz').fill('300');
    await expect
      .poll(() => page.locator('[data-echo-for="buck.switchingKilohertz"]').textContent())
      .toBe('= 300\u202f000 Hz');
    expect(await page.locator('[data-echo-for="buck.inductorMicrohenries"]').textContent()).toBe(
      '= 0.000068 H',
    );
    // With L and f the ripple peak is drawn on the current strip.
    await page.locator('[data-plot="ripple-peak"]').waitFor();

    await input(page, 'buck.switchingKilohertz').fill('300000');
    await expect
      .poll(() => errorFor(page, 'buck.switchingKilohertz').textContent())
      .toMatch(/in kHz: for 300 kHz, type 300/);
    expect(await input(page, 'buck.inductorMicrohenries').inputValue()).toBe('68');
    await page.context().close();
  });

  test('what was typed survives a reload of the page', async () => {
    const page = await openCheck();
    await input(page, 'string.count').fill('3');
    await input(page, 'supply.volts').fill('1e308');
    await errorFor(page, 'supply.volts').waitFor();
    await page.reload();
    await expect.poll(() => input(page, 'supply.volts').inputValue()).toBe('1e308');
    expect(await input(page, 'string.count').inputValue()).toBe('3');
    expect(await errorFor(page, 'supply.volts').isVisible()).toBe(true);
    await page.context().close();
  });
});

describe('bench check: heat', () => {
  test('a sink too weak for the LEDs shows the thermal caution with the sink it needs', async () => {
    const page = await openCheck();
    // The example build: 5 LEDs, Vf max 3.4 V at 350 mA, so each LED turns 3.4 × 0.35 = 1.19 W into heat
    // (rule 7 of lib/electrical/README.md: worst-case Vf, all power counted as heat). On one 12 °C/W sink:
    // sink 25 + 5 × 1.19 × 12 = 96.4 °C, junction 96.4 + 1.19 × (8 + 2) = 108.3 °C, within 25 °C of 125 °C
    // → caution. The largest sink that keeps the junction at or under 100 °C:
    // (125 − 25 − 25 − 11.9) / 5.95 = 10.61 °C/W, advised rounded down as 10.6 °C/W.
    await page.getByLabel('LEDs mounted on heat sinks').check();
    await input(page, 'heatSink.count').fill('1');
    await input(page, 'heatSink.cPerW').fill('12');
    const junction = page.locator('#bench-results [data-check="led-junction"]');
    await expect.poll(() => junction.getAttribute('data-verdict')).toBe('caution');
    const advice = page.locator('[data-thermal-advice]');
    await expect.poll(() => advice.textContent()).toMatch(/at most 10\.6 °C\/W/);
    const panel = page.locator('[data-panel="thermal"]');
    expect(await panel.textContent()).toMatch(/LED junction\s*108 °C/);
    expect(await panel.textContent()).toMatch(/Heat sink\s*96 °C/);
    // The verdict reads as a word and an icon, not only a colour.
    const badge = junction.locator('[data-verdict="caution"]').first();
    expect(await badge.textContent()).toContain('Caution');
    expect(await badge.locator('svg').count()).toBe(1);

    // A sink at the advised value passes: sink 25 + 5.95 × 10.6 = 88.1 °C, junction 100.0 °C.
    await input(page, 'heatSink.cPerW').fill('10.6');
    await expect.poll(() => junction.getAttribute('data-verdict')).toBe('ok');
    await page.context().close();
  });
});

describe('bench check fits 390 px with no sideways scroll', () => {
  test.each(['light', 'dark'] as const)(
    '%s scheme: results, errors, every optional section open',
    async (scheme) => {
      const page = await openCheck(scheme);
      expect(await page.evaluate(() => matchMedia('(prefers-color-scheme: dark)').matches)).toBe(
        scheme === 'dark',
      );
      expect(await fitsWidth(page)).toBe(true);

      await page.getByLabel('Dimmed with PWM').check();
      await page.getByLabel('Wire run from the supply to the driver').check();
      await page.getByLabel('LEDs mounted on heat sinks').check();
      await input(page, 'buck.inductorMicrohenries').fill('68');
      await input(page, 'buck.switchingKilohertz').fill('300');
      await input(page, 'buck.inductorSatAmps').fill('0,5');
      await page.locator('[data-plot="ripple-peak"]').waitFor();
      expect(await fitsWidth(page)).toBe(true);

      await input(page, 'supply.volts').fill('48'); // near the 60 V limit: the limit is drawn on the scale
      await page.locator('[data-plot="selv"] line').waitFor({ state: 'attached' }); // a vertical line has no width: attached, not visible
      expect(await fitsWidth(page)).toBe(true);

      await input(page, 'supply.volts').fill('1e308');
      await input(page, 'string.vfTyp').fill('letters');
      await errorFor(page, 'string.vfTyp').waitFor();
      expect(await fitsWidth(page)).toBe(true);

      await page.locator('input[name="driverType"][value="linear"]').check();
      await input(page, 'linear.sinkCPerW').fill('5');
      expect(await fitsWidth(page)).toBe(true);
      await page.context().close();
    },
  );
});
