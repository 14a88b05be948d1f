import { beforeAll, describe, expect, it } from 'vitest';
import { PDFDocument, StandardFonts, type PDFFont } from 'pdf-lib';
import { InvalidError } from '@/lib/errors';
import { encodeCode, formatCode, newCode } from '@/labels/code';
import { LAYOUTS, getLayout, labelsPerPage, type Layout } from '@/labels/layouts';
import { renderLabelsPdf } from '@/labels/pdf';
import type { LabelItem } from '@/labels/schema';
import { labelUrl } from '@/labels/url';
import { bounds, decodeRects, pageContent, readLabels, toMm, type LabelGroup } from '../../helpers/label-read-back';

// Positions are read back from the PDF itself: page size through pdf-lib's page.getSize(), label
// origins from the `re W n` clip rectangle that opens each label in the page's content stream.
const TOLERANCE_MM = 0.1;
const BASE = 'https://bench.quillmere.example';

const NAMES = [
  'Constant-current buck driver, 350 mA, 6–36 V in',
  '3 W white LED on 20 mm star',
  '24 V 2 A wall supply',
  'Aluminium heat sink, 40 × 40 mm, for star boards, with a very long description that cannot fit',
];
const SPECS = ['350 mA · 6–36 V in', 'Vf 2.9–3.6 V @ 700 mA', '24 V ± 5 % · 2 A', undefined];

function items(count: number): LabelItem[] {
  return Array.from({ length: count }, (_, i) => {
    const code = newCode();
    return { code, url: labelUrl(BASE, code), name: NAMES[i % NAMES.length], spec: SPECS[i % SPECS.length] };
  });
}

// WinAnsiEncoding (PDF 32000-1 Annex D) differs from Latin-1 in 0x80–0x9F; these are the ones we print.
const WIN_ANSI_EXTRA: Record<string, string> = { '\x85': '…', '\x96': '–', '\x97': '—' };
const winAnsi = (s: string) => s.replace(/[\x80-\x9f]/g, (c) => WIN_ANSI_EXTRA[c] ?? c);

type Rendered = { doc: PDFDocument; pages: { widthMm: number; heightMm: number; labels: LabelGroup[] }[] };

async function render(list: LabelItem[], layoutId: string, opts = {}): Promise<Rendered> {
  const doc = await PDFDocument.load(await renderLabelsPdf(list, layoutId, opts));
  const pages = doc.getPages().map((page) => {
    const { width, height } = page.getSize();
    return { widthMm: toMm(width), heightMm: toMm(height), labels: readLabels(pageContent(doc, page)) };
  });
  return { doc, pages };
}

/** A label's top-left corner in mm from the page's top-left, as read from the PDF. */
const originMm = (g: LabelGroup, pageHeightMm: number) => ({
  x: toMm(g.clip.x),
  y: pageHeightMm - toMm(g.clip.y + g.clip.h),
});

describe.each(LAYOUTS.map((l) => [l.id, l] as const))('layout %s', (_id, layout: Layout) => {
  const perPage = labelsPerPage(layout);
  const count = Math.max(perPage + Math.ceil(perPage / 2) + 1, NAMES.length); // a full page and a partial one
  const list = items(count);
  let rendered: Rendered;
  beforeAll(async () => {
    rendered = await render(list, layout.id);
  });

  it('has the page size of the layout and as many pages as needed', () => {
    expect(rendered.pages).toHaveLength(Math.ceil(count / perPage));
    for (const page of rendered.pages) {
      expect(Math.abs(page.widthMm - layout.page.widthMm)).toBeLessThan(TOLERANCE_MM);
      expect(Math.abs(page.heightMm - layout.page.heightMm)).toBeLessThan(TOLERANCE_MM);
    }
    expect(rendered.pages.map((p) => p.labels.length).reduce((a, b) => a + b)).toBe(count);
  });

  it('places labels at the margins, the label size and the pitch of the layout (±0.1 mm)', () => {
    for (const page of rendered.pages) {
      const origins = page.labels.map((g) => originMm(g, page.heightMm));
      for (const g of page.labels) {
        expect(Math.abs(toMm(g.clip.w) - layout.label.widthMm)).toBeLessThan(TOLERANCE_MM);
        expect(Math.abs(toMm(g.clip.h) - layout.label.heightMm)).toBeLessThan(TOLERANCE_MM);
      }
      expect(Math.abs(origins[0].x - layout.marginsMm.left)).toBeLessThan(TOLERANCE_MM);
      expect(Math.abs(origins[0].y - layout.marginsMm.top)).toBeLessThan(TOLERANCE_MM);
      // Row by row: the next label is one horizontal pitch to the right, or the first of the next row.
      for (let i = 1; i < origins.length; i++) {
        const [prev, next] = [origins[i - 1], origins[i]];
        if (i % layout.columns === 0) {
          expect(Math.abs(next.x - layout.marginsMm.left)).toBeLessThan(TOLERANCE_MM);
          expect(Math.abs(next.y - prev.y - layout.pitchMm.y)).toBeLessThan(TOLERANCE_MM);
        } else {
          expect(Math.abs(next.x - prev.x - layout.pitchMm.x)).toBeLessThan(TOLERANCE_MM);
          expect(Math.abs(next.y - prev.y)).toBeLessThan(TOLERANCE_MM);
        }
      }
    }
  });

  it("draws a QR on every label that jsQR decodes to that label's exact URL", () => {
    const groups = rendered.pages.flatMap((p) => p.labels);
    groups.forEach((g, i) => {
      // Only the symbol and its 4-module quiet zone are handed to the decoder.
      const symbol = bounds(g.filled);
      const quiet = 4 * Math.min(...g.filled.map((r) => r.h));
      const area = {
        x: symbol.x - quiet,
        y: symbol.y - quiet,
        w: symbol.w + 2 * quiet,
        h: symbol.h + 2 * quiet,
      };
      const decoded = decodeRects(g.filled, area, 8);
      expect(decoded?.data, `label ${i}`).toBe(list[i].url);
      // Upright, not mirrored: finder patterns at top-left, top-right and bottom-left of the image.
      const {
        topLeftFinderPattern: tl,
        topRightFinderPattern: tr,
        bottomLeftFinderPattern: bl,
      } = decoded!.location;
      expect(tr.x - tl.x).toBeGreaterThan(0);
      expect(bl.y - tl.y).toBeGreaterThan(0);
      expect(Math.abs(tr.y - tl.y) + Math.abs(bl.x - tl.x)).toBeLessThan(4);
    });
  }, 60_000); // jsQR over every label of a sheet: seconds of CPU, more on a shared machine

  it('keeps a quiet zone of 4 modules around each QR, text included', () => {
    for (const g of rendered.pages.flatMap((p) => p.labels)) {
      const symbol = bounds(g.filled);
      const moduleSize = Math.min(...g.filled.map((r) => r.h));
      // A version-v symbol is 17 + 4v modules wide (ISO/IEC 18004 §5.3.1).
      expect((Math.round(symbol.w / moduleSize) - 17) % 4).toBe(0);
      expect(symbol.x - g.clip.x).toBeGreaterThanOrEqual(4 * moduleSize - 1e-6);
      expect(symbol.y - g.clip.y).toBeGreaterThanOrEqual(4 * moduleSize - 1e-6);
      expect(g.clip.y + g.clip.h - (symbol.y + symbol.h)).toBeGreaterThanOrEqual(4 * moduleSize - 1e-6);
      for (const t of g.texts)
        expect(t.x).toBeGreaterThanOrEqual(symbol.x + symbol.w + 4 * moduleSize - 1e-6);
    }
  });

  it('prints the code, the name (truncated to fit) and the spec line, all inside the label', async () => {
    const metrics = await PDFDocument.create();
    const fonts: Record<string, PDFFont> = {
      Code: await metrics.embedFont(StandardFonts.CourierBold),
      Bold: await metrics.embedFont(StandardFonts.HelveticaBold),
      Text: await metrics.embedFont(StandardFonts.Helvetica),
    };
    rendered.pages
      .flatMap((p) => p.labels)
      .forEach((g, i) => {
        const byFont = (tag: string) =>
          g.texts.filter((t) => t.font.startsWith(`/${tag}`)).map((t) => winAnsi(t.text));
        expect(byFont('Code')).toEqual([formatCode(list[i].code)]);
        const name = byFont('Bold').join(' ');
        expect(name.length).toBeGreaterThan(0);
        expect(list[i].name.startsWith(name.replace(/…$/, ''))).toBe(true);
        expect(byFont('Text')).toEqual(list[i].spec ? [expect.stringMatching(/\S/)] : []);
        if (list[i].spec) expect(list[i].spec!.startsWith(byFont('Text')[0].replace(/…$/, ''))).toBe(true);
        for (const t of g.texts) {
          const font = fonts[/^\/(\w+)/.exec(t.font)![1]];
          expect(t.x + font.widthOfTextAtSize(winAnsi(t.text), t.size)).toBeLessThanOrEqual(
            g.clip.x + g.clip.w + 1e-6,
          );
          expect(t.y - t.size * 0.25).toBeGreaterThanOrEqual(g.clip.y); // descenders stay on the label
          expect(t.y + t.size).toBeLessThanOrEqual(g.clip.y + g.clip.h);
        }
      });
    // The longest name does not fit on any layout and ends in an ellipsis.
    const truncated = rendered.pages
      .flatMap((p) => p.labels)[3]
      .texts.filter((t) => t.font.startsWith('/Bold'));
    expect(winAnsi(truncated.at(-1)!.text)).toMatch(/…$/);
  });
});

describe('renderLabelsPdf options and metadata', () => {
  it('sets the title and asks viewers to print at 100 %', async () => {
    const { doc } = await render(items(2), 'roll-50x25', { title: 'Shelf B labels' });
    expect(doc.getTitle()).toBe('Shelf B labels');
    expect(doc.getCreator()).toBe('Ohmstead');
    expect(doc.catalog.getViewerPreferences()?.getPrintScaling()).toBe('None');
    const untitled = await render(items(3), 'a4-24');
    expect(untitled.doc.getTitle()).toMatch(/3/);
  });

  it('reports progress up to the total, never going back', async () => {
    const calls: [number, number][] = [];
    await renderLabelsPdf(items(65), 'letter-30', { onProgress: (done, total) => calls.push([done, total]) });
    expect(calls.length).toBeGreaterThanOrEqual(3); // one per page at least
    expect(calls.at(-1)).toEqual([65, 65]);
    for (let i = 1; i < calls.length; i++) expect(calls[i][0]).toBeGreaterThan(calls[i - 1][0]);
  });

  it('skips slots already used on the first sheet', async () => {
    const a4 = getLayout('a4-24')!;
    const { pages } = await render(items(24), 'a4-24', { skipSlots: 5 });
    expect(pages.map((p) => p.labels.length)).toEqual([19, 5]);
    const first = originMm(pages[0].labels[0], pages[0].heightMm);
    // Slot 5 is row 1, column 2.
    expect(Math.abs(first.x - (a4.marginsMm.left + 2 * a4.pitchMm.x))).toBeLessThan(TOLERANCE_MM);
    expect(Math.abs(first.y - (a4.marginsMm.top + a4.pitchMm.y))).toBeLessThan(TOLERANCE_MM);
  });

  it('strokes outlines only when asked', async () => {
    const doc = await PDFDocument.load(await renderLabelsPdf(items(1), 'roll-50x25', { outline: true }));
    expect(pageContent(doc, doc.getPages()[0])).toMatch(/ re S/);
    const plain = await PDFDocument.load(await renderLabelsPdf(items(1), 'roll-50x25'));
    expect(pageContent(plain, plain.getPages()[0])).not.toMatch(/ re S/);
  });

  it('prints names with characters the standard fonts lack', async () => {
    const code = encodeCode(4242);
    const { pages } = await render(
      [{ code, url: labelUrl(BASE, code), name: '10 Ω ≤ 1 W resistor', spec: '−5 V → 5 V' }],
      'roll-50x25',
    );
    const texts = (tag: string) =>
      pages[0].labels[0].texts.filter((t) => t.font.startsWith(tag)).map((t) => winAnsi(t.text));
    expect(texts('/Bold').join(' ')).toBe('10 ohm <= 1 W resistor');
    expect(texts('/Text')).toEqual(['-5 V -> 5 V']);
  });
});

describe('renderLabelsPdf refuses bad input with the field named', () => {
  const fieldsOf = async (run: Promise<unknown>) => {
    const error = await run.then(
      () => null,
      (e: unknown) => e,
    );
    expect(error).toBeInstanceOf(InvalidError);
    return Object.keys((error as InvalidError).fields ?? {});
  };

  it('unknown layout, no items, skip beyond the page', async () => {
    expect(await fieldsOf(renderLabelsPdf(items(1), 'a3-whatever'))).toEqual(['layoutId']);
    expect(await fieldsOf(renderLabelsPdf([], 'a4-24'))).toEqual(['items']);
    expect(await fieldsOf(renderLabelsPdf(items(1), 'a4-24', { skipSlots: 24 }))).toEqual(['skipSlots']);
  });

  it('a code whose check symbol is wrong, a non-http URL, an empty name', async () => {
    const [good] = items(1);
    const bad = [
      good,
      { ...good, code: 'K7F2QX~' },
      { ...good, url: 'javascript:alert(1)' },
      { ...good, name: '  ' },
    ];
    expect(await fieldsOf(renderLabelsPdf(bad, 'a4-24'))).toEqual([
      'items.1.code',
      'items.2.url',
      'items.3.name',
    ]);
  });
});
