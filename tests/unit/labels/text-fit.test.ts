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
    const cut = truncateToWidth(font, text, 8, 60);
    expect(cut).toMatch(/…$/);
    expect(font.widthOfTextAtSize(cut, 8)).toBeLessThanOrEqual(60);
    // Maximal: one more character would not fit.
    const kept = cut.slice(0, -1);
    const longer = text.slice(0, kept.length + 1).trimEnd() + '…';
    expect(font.widthOfTextAtSize(longer, 8)).toBeGreaterThan(60);
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
