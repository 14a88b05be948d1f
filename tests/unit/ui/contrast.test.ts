import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import config from '@/tailwind.config';
import { contrastRatio, relativeLuminance } from '@/lib/contrast';

// Text on the primary buttons against WCAG 2.2 AA, success criterion 1.4.3 (Contrast, Minimum): at least
// 4.5:1 for normal text. Formula: WCAG 2.2 definitions of relative luminance and contrast ratio
// (https://www.w3.org/TR/WCAG22/#dfn-contrast-ratio), in lib/contrast.ts.

const accent = (config.theme?.extend?.colors as Record<string, Record<string, string>>).accent;
const css = readFileSync(path.resolve(__dirname, '../../../app/globals.css'), 'utf8');
const primaryRule = css.match(/\.btn-primary\s*\{([^}]*)\}/)?.[1] ?? '';

describe('the contrast formula', () => {
  it('gives the end points WCAG 2.2 defines: 21:1 for black on white, 1:1 for a colour on itself', () => {
    // WCAG 2.2, definition of contrast ratio: "Contrast ratios can range from 1 to 21".
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 5);
    expect(contrastRatio('#0f766e', '#0f766e')).toBe(1);
    expect(relativeLuminance('#ffffff')).toBeCloseTo(1, 10);
    expect(relativeLuminance('#000000')).toBe(0);
  });

  it('puts mid grey #777777 just under 4.5:1 on white and #767676 just over (from memory)', () => {
    expect(contrastRatio('#777777', '#ffffff')).toBeLessThan(4.5);
    expect(contrastRatio('#767676', '#ffffff')).toBeGreaterThan(4.5);
  });
});

describe('the primary buttons, in both colour schemes', () => {
  it('take their colours from the configured accent in light and dark (no other teal)', () => {
    expect(primaryRule).toMatch(/(^|\s)bg-accent(\s|;)/);
    expect(primaryRule).toMatch(/(^|\s)text-accent-ink(\s|;)/);
    expect(primaryRule).toMatch(/dark:bg-accent(\s|;)/);
    expect(primaryRule).toMatch(/dark:text-accent-ink(\s|;)/);
    expect(primaryRule).not.toMatch(/teal-|text-white/);
  });

  it.each([
    ['at rest', 'DEFAULT'],
    ['under the pointer', 'strong'],
  ])('have text at least 4.5:1 on the button %s', (_when, shade) => {
    const ratio = contrastRatio(accent.ink, accent[shade]);
    expect(ratio).toBeGreaterThanOrEqual(4.5);
  });

  it('measure 5.47:1 at rest (white on #0f766e)', () => {
    expect(contrastRatio(accent.ink, accent.DEFAULT)).toBeCloseTo(5.47, 2);
  });
});
