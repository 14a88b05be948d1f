import { beforeAll, describe, expect, it } from 'vitest';
import { PDFDocument, StandardFonts, type PDFFont } from 'pdf-lib';
import { drawable, truncateToWidth, wrapToWidth } from '@/labels/text-fit';

let font: PDFFont;
beforeAll(async () => {
  font = await (await PDFDocument.create()).embedFont(StandardFonts.Helvetica);
});

describe('text fitting for the standard fonts', () => {
  it('keeps WinAnsi characters and spells out the rest', () => {
    expect(drawable(font, '6–36 V · 350 mA × 2, 5 µs')).toBe('6–36 V · 350 mA × 2, 5 µs');
    expect(drawable(font, '10 Ω\t≥ 1 W  ✓')).toBe('10 ohm >= 1 W ?');
    expect(() => font.encodeText(drawable(font, 'Ω≤≥→−✓漢'))).not.toThrow();
  });

  it('truncates with an ellipsis to the measured width, and leaves short text alone', () => {
    const text = 'Constant-current buck driver, 350 mA, 6–36 V in';
    expect(truncateToWidth(font, 'short', 8, 100)).toBe('short');
    const cut = truncateToWidth(font, text, 8, 100);
    expect(cut).toMatch(/…$/);
    expect(font.widthOfTextAtSize(cut, 8)).toBeLessThanOrEqual(100);
    // At a word boundary (issue 12: "buck driver, 1000 m" was cut mid-word), and maximal: the next
    // whole word would not fit.
    const kept = cut.slice(0, -1);
    expect(text.startsWith(kept)).toBe(true);
    expect([' ', ',']).toContain(text[kept.length]);
    const nextWord = text.slice(0, text.indexOf(' ', kept.length + 1)).replace(/,$/, '');
    expect(font.widthOfTextAtSize(nextWord + '…', 8)).toBeGreaterThan(100);
  });

  it('never ends a shortened name inside a word or on a comma', () => {
    const name = 'Constant-current buck driver, 1000 mA, 9–48 V input, potted';
    const firstWord = font.widthOfTextAtSize('Constant-current…', 8);
    for (const extra of [1, 8, 20, 35, 50, 70, 90]) {
      const width = firstWord + extra;
      const cut = truncateToWidth(font, name, 8, width);
      expect(font.widthOfTextAtSize(cut, 8)).toBeLessThanOrEqual(width);
      const kept = cut.replace(/…$/, '');
      expect(cut.endsWith('…')).toBe(true);
      expect(kept).not.toMatch(/[,\s]$/);
      expect([' ', ',']).toContain(name[kept.length]);
    }
    // Only a single word wider than the box is cut inside it.
    expect(truncateToWidth(font, 'Unbrokenpartdescription', 8, 30)).toMatch(/^Unbr\w*…$/);
  });

  it('wraps at spaces, breaks a word wider than the box, and caps the line count', () => {
    const lines = wrapToWidth(font, 'Finned heat sink for star boards, 40 mm', 8, 70, 3);
    expect(lines.length).toBeGreaterThan(1);
    expect(lines.join(' ')).toBe('Finned heat sink for star boards, 40 mm');
    const word = 'Ultralongunbrokenpartdescriptionwithoutanyspacesatall';
    const broken = wrapToWidth(font, word, 8, 50, 2);
    expect(broken).toHaveLength(2);
    expect(broken[1]).toMatch(/…$/);
    expect(word.startsWith(broken[0])).toBe(true);
    for (const line of lines) expect(font.widthOfTextAtSize(line, 8)).toBeLessThanOrEqual(70);
    for (const line of broken) expect(font.widthOfTextAtSize(line, 8)).toBeLessThanOrEqual(50);
  });
});
