import { describe, expect, it } from 'vitest';
import { LAYOUTS, getLayout, labelsPerPage, layoutSchema, slotOrigins, type Layout } from '@/labels/layouts';

const INCH_MM = 25.4; // exact by definition (international inch, 1959)

describe('layout catalogue', () => {
  it('has an A4 sheet, a US Letter sheet and a single-label roll, each valid', () => {
    expect(LAYOUTS.map((l) => l.id)).toEqual(['a4-24', 'letter-30', 'roll-50x25']);
    for (const layout of LAYOUTS) expect(layoutSchema.safeParse(layout).success).toBe(true);
  });

  it('uses the standard page sizes', () => {
    // ISO 216: A4 = 210 × 297 mm.
    expect(getLayout('a4-24')?.page).toEqual({ widthMm: 210, heightMm: 297 });
    // ANSI/ASME Y14.1: Letter = 8.5 × 11 in = 215.9 × 279.4 mm.
    const letter = getLayout('letter-30')!;
    expect(letter.page.widthMm).toBeCloseTo(8.5 * INCH_MM, 9);
    expect(letter.page.heightMm).toBeCloseTo(11 * INCH_MM, 9);
  });

  it('puts every slot fully on the page, inside the margins, without overlap', () => {
    for (const layout of LAYOUTS) {
      const slots = slotOrigins(layout);
      expect(slots).toHaveLength(labelsPerPage(layout));
      for (const { xMm, yMm } of slots) {
        expect(xMm).toBeGreaterThanOrEqual(layout.marginsMm.left - 1e-9);
        expect(yMm).toBeGreaterThanOrEqual(layout.marginsMm.top - 1e-9);
        expect(xMm + layout.label.widthMm).toBeLessThanOrEqual(
          layout.page.widthMm - layout.marginsMm.right + 1e-6,
        );
        expect(yMm + layout.label.heightMm).toBeLessThanOrEqual(
          layout.page.heightMm - layout.marginsMm.bottom + 1e-6,
        );
      }
      for (const [i, a] of slots.entries()) {
        for (const b of slots.slice(i + 1)) {
          const apart =
            Math.abs(a.xMm - b.xMm) >= layout.label.widthMm - 1e-9 ||
            Math.abs(a.yMm - b.yMm) >= layout.label.heightMm - 1e-9;
          expect(apart).toBe(true);
        }
      }
    }
  });

  it('A4 grid: 3 × 70 mm fill the width and 8 × 37 mm sit 0.5 mm from top and bottom', () => {
    const a4 = getLayout('a4-24')!;
    const slots = slotOrigins(a4);
    expect(slots[0]).toEqual({ xMm: 0, yMm: 0.5 });
    expect(slots[23]).toEqual({ xMm: 140, yMm: 0.5 + 7 * 37 });
  });
});

describe('layoutSchema', () => {
  const base: Layout = getLayout('a4-24')!;
  const issuesOf = (candidate: unknown) => {
    const result = layoutSchema.safeParse(candidate);
    return result.success ? [] : result.error.issues.map((i) => i.path.join('.'));
  };

  it('rejects a grid that runs off the page, naming the field', () => {
    expect(issuesOf({ ...base, rows: 9 })).toEqual(['rows']);
    expect(issuesOf({ ...base, columns: 4 })).toEqual(['columns']);
    expect(issuesOf({ ...base, marginsMm: { ...base.marginsMm, left: 1 } })).toEqual(['columns']);
  });

  it('rejects overlapping labels, negative sizes and padding with no room left', () => {
    expect(issuesOf({ ...base, pitchMm: { x: 69, y: 37 } })).toContain('pitchMm.x');
    expect(issuesOf({ ...base, label: { widthMm: -70, heightMm: 37 } })).toContain('label.widthMm');
    expect(issuesOf({ ...base, paddingMm: 18.5 })).toEqual(['paddingMm']);
  });

  it('unknown layout ids are not found', () => {
    expect(getLayout('a4-99')).toBeUndefined();
  });
});
