import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import QRCode from 'qrcode';
import { chromium } from 'playwright-core';
import type { Browser, Page } from 'playwright-core';
import { PDFDocument } from 'pdf-lib';
import { closeTestDb, makeLocation, makeSpace, makeUser, testDb, uniq } from '../helpers/db';
import { fitsWidth, launchBrowser, newPage, seriousA11yViolations, signInPage } from '../helpers/browser';
import { BASE } from '../helpers/http';
import { labelUrl } from '@/labels/url';

// The shelf in Debian Chromium: a steward adds a labelled part and prints its labels; a member at
// phone width types a unit's code on /scan and lands on the part page. People of a space of their
// own, so the demo accounts' sign-in limits are not spent here.

const db = testDb();
let browser: Browser;
let steward: { email: string; password: string };
let member: { email: string; password: string };
let binName: string;
const sku = uniq('E2E-PSU');
let partId: string;

beforeAll(async () => {
  const space = await makeSpace(db);
  steward = await makeUser(db, space.id, ['steward'], 'Shelf steward');
  member = await makeUser(db, space.id, ['member'], 'Shelf member');
  binName = (await makeLocation(db, space.id, 'Bin E · supplies')).name;
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await closeTestDb();
});

async function signIn(page: Page, who: { email: string; password: string }) {
  await signInPage(page, who.email, who.password);
}

describe('steward', () => {
  test('adds a labelled part and prints its label PDF', async () => {
    const page = await newPage(browser, 1280, 900);
    await signIn(page, steward);
    await page.goto('/shelf/parts/new');
    await page.getByLabel('SKU').fill(sku);
    await page.getByLabel('Name').fill('E2E 24 V 2 A wall supply');
    await page.getByLabel('Category').selectOption('supply');
    await page.getByLabel('Output (V)').fill('24');
    await page.getByLabel('Maximum current (A)').fill('2');
    await page.getByLabel('Units to label now').fill('2');
    await page.getByLabel('Put them in').selectOption({ label: binName });
    await page.getByRole('button', { name: 'Add part' }).click();
    await page.waitForURL(/\/shelf\/parts\/[0-9a-f-]{36}$/);
    partId = page.url().split('/').pop()!;
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('E2E 24 V 2 A wall supply');

    const [response, download] = await Promise.all([
      page.waitForResponse((r) => r.url().endsWith('/api/labels') && r.request().method() === 'POST'),
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Print 2 unit labels' }).click(),
    ]);
    expect(response.status()).toBe(200);
    expect(response.headers()['content-type']).toBe('application/pdf');
    expect(download.suggestedFilename()).toBe('labels.pdf');
    const saved = await readFile((await download.path())!);
    expect(saved.subarray(0, 5).toString()).toBe('%PDF-');
    expect((await PDFDocument.load(saved)).getPageCount()).toBe(1);
    await page.getByText('2 labels ready').waitFor();
    await page.context().close();
  });
});

describe('member at phone width', () => {
  test('a typed unit code on /scan opens the part page, with that unit marked', async () => {
    const unit = await db
      .selectFrom('units')
      .innerJoin('parts', 'parts.id', 'units.part_id')
      .select(['units.code', 'parts.id'])
      .where('parts.sku', '=', sku)
      .orderBy('units.serial')
      .executeTakeFirstOrThrow();
    const page = await newPage(browser, 390);
    await signIn(page, member);
    await page.goto('/scan');
    expect(await fitsWidth(page)).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);

    // A typo first: the check symbol catches it and the real code is offered.
    const typo = unit.code[2] === '0' ? '1' : '0';
    await page.getByLabel('Label code').fill(`${unit.code.slice(0, 2)}${typo}${unit.code.slice(3)}`);
    await page.getByLabel('Label code').press('Enter');
    await page.getByText('Did you mean').waitFor();

    // Then the code as printed (with its hyphen, in lower case), ended with Enter like a USB scanner.
    await page.getByLabel('Label code').fill(`${unit.code.slice(0, 4)}-${unit.code.slice(4)}`.toLowerCase());
    await page.getByLabel('Label code').press('Enter');
    await page.waitForURL((u) => u.pathname === `/shelf/parts/${unit.id}`);
    expect(new URL(page.url()).searchParams.get('unit')).toBe(unit.code);
    expect(await page.locator(`[id="unit-${unit.code}"]`).getAttribute('aria-current')).toBe('true');
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('E2E 24 V 2 A wall supply');
    expect(await fitsWidth(page)).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);
    // Members read the shelf; the steward's controls are not there.
    expect(await page.getByRole('button', { name: /Print/ }).count()).toBe(0);
    await page.context().close();
  });

  test('the steward’s part page also fits 390 px and passes axe', async () => {
    const page = await newPage(browser, 390);
    await signIn(page, steward);
    await page.goto(`/shelf/parts/${partId}`);
    expect(await fitsWidth(page)).toBe(true);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page.context().close();
  });
});

/**
 * A video Chromium plays as its camera: the QR of `text` on a white 640 × 480 frame, as YUV 4:2:0
 * (the y4m format Chromium's --use-file-for-fake-video-capture reads).
 */
function qrVideo(text: string): Buffer {
  const W = 640;
  const H = 480;
  const qr = QRCode.create(text, { errorCorrectionLevel: 'M' }).modules;
  const quiet = 4;
  const px = Math.floor(Math.min(W, H) / (qr.size + 2 * quiet));
  const x0 = Math.floor((W - qr.size * px) / 2);
  const y0 = Math.floor((H - qr.size * px) / 2);
  const luma = Buffer.alloc(W * H, 235);
  for (let r = 0; r < qr.size; r++)
    for (let c = 0; c < qr.size; c++)
      if (qr.get(r, c))
        for (let dy = 0; dy < px; dy++)
          luma.fill(16, (y0 + r * px + dy) * W + x0 + c * px, (y0 + r * px + dy) * W + x0 + (c + 1) * px);
  const chroma = Buffer.alloc((W / 2) * (H / 2) * 2, 128);
  const frame = Buffer.concat([Buffer.from('FRAME\n'), luma, chroma]);
  return Buffer.concat([
    Buffer.from(`YUV4MPEG2 W${W} H${H} F10:1 Ip A1:1 C420jpeg\n`),
    ...Array.from({ length: 10 }, () => frame),
  ]);
}

describe('camera', () => {
  test('"Use camera" loads the decoder, reads a label QR holding the full URL, and opens the part', async () => {
    const part = await db
      .selectFrom('parts')
      .select(['id', 'code'])
      .where('sku', '=', sku)
      .executeTakeFirstOrThrow();
    const dir = await mkdtemp(path.join(tmpdir(), 'ohm-cam-'));
    const video = path.join(dir, 'qr.y4m');
    await writeFile(video, qrVideo(labelUrl(BASE, part.code!)));
    const camBrowser = await chromium.launch({
      executablePath: '/usr/bin/chromium',
      headless: true,
      args: [
        '--no-sandbox',
        '--disable-gpu',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-quic',
        '--no-first-run',
        '--use-fake-ui-for-media-stream',
        '--use-fake-device-for-media-stream',
        `--use-file-for-fake-video-capture=${video}`,
      ],
    });
    try {
      const context = await camBrowser.newContext({
        viewport: { width: 390, height: 844 },
        baseURL: BASE,
        permissions: ['camera'],
      });
      const page = await context.newPage();
      await signIn(page, member);
      await page.goto('/scan');
      await page.waitForLoadState('networkidle');
      // The decoder is not part of the page until the button is pressed: scripts arrive only then.
      // Scripts fetched after the click and before the move to the part page are the decoder's.
      const lateScripts: string[] = [];
      let leaving = false;
      page.on('request', (r) => {
        if (r.url().includes('/shelf/parts/')) leaving = true;
        else if (!leaving && r.resourceType() === 'script') lateScripts.push(r.url());
      });
      await page.getByRole('button', { name: 'Use camera' }).click();
      // Decoding frames of a fake camera on a busy two-core machine can take a while; say what the page
      // showed if it never gets there.
      await page
        .waitForURL((u) => u.pathname === `/shelf/parts/${part.id}`, { timeout: 60_000 })
        .catch(async (err) => {
          const shown = await page
            .locator('main')
            .innerText()
            .catch(() => '(page gone)');
          throw new Error(
            `never reached the part page for ${part.code}; the page said: ${shown.slice(0, 400)}`,
            { cause: err },
          );
        });
      expect(lateScripts.length).toBeGreaterThan(0);
    } finally {
      await camBrowser.close();
      await rm(dir, { recursive: true, force: true });
    }
  });
});
