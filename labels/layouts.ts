// Label layouts, described only by their millimetres. Names are our own and say what the stock looks
// like (page, grid, label size); they are not anyone's product numbers.
import { z } from 'zod';

/** Slack for decimal millimetres (inch-based sheets do not land on round numbers). */
const FIT_TOLERANCE_MM = 0.001;

const mm = z.number().finite().nonnegative();
const positiveMm = z.number().finite().positive();

export const layoutSchema = z
  .object({
    id: z.string().regex(/^[a-z0-9-]+$/),
    name: z.string().min(1),
    page: z.object({ widthMm: positiveMm, heightMm: positiveMm }),
    /** Distance from each page edge to the label grid. */
    marginsMm: z.object({ top: mm, right: mm, bottom: mm, left: mm }),
    columns: z.number().int().positive(),
    rows: z.number().int().positive(),
    label: z.object({ widthMm: positiveMm, heightMm: positiveMm }),
    /** Distance from one label's left (top) edge to the next one's: label size plus the gap. */
    pitchMm: z.object({ x: positiveMm, y: positiveMm }),
    /** Blank border inside each label; keeps print away from die-cut edges and printer margins. */
    paddingMm: mm,
  })
  .superRefine((l, ctx) => {
    const issue = (path: (string | number)[], message: string) =>
      ctx.addIssue({ code: 'custom', path, message });
    if (l.pitchMm.x + FIT_TOLERANCE_MM < l.label.widthMm)
      issue(['pitchMm', 'x'], 'labels would overlap across');
    if (l.pitchMm.y + FIT_TOLERANCE_MM < l.label.heightMm)
      issue(['pitchMm', 'y'], 'labels would overlap down');
    const gridWidth = (l.columns - 1) * l.pitchMm.x + l.label.widthMm;
    const gridHeight = (l.rows - 1) * l.pitchMm.y + l.label.heightMm;
    const roomAcross = l.page.widthMm - l.marginsMm.left - l.marginsMm.right;
    const roomDown = l.page.heightMm - l.marginsMm.top - l.marginsMm.bottom;
    if (gridWidth > roomAcross + FIT_TOLERANCE_MM) {
      issue(['columns'], `grid is ${gridWidth} mm wide but only ${roomAcross} mm fit between the margins`);
    }
    if (gridHeight > roomDown + FIT_TOLERANCE_MM) {
      issue(['rows'], `grid is ${gridHeight} mm tall but only ${roomDown} mm fit between the margins`);
    }
    if (2 * l.paddingMm >= Math.min(l.label.widthMm, l.label.heightMm)) {
      issue(['paddingMm'], 'padding leaves no room inside the label');
    }
  });

export type Layout = z.infer<typeof layoutSchema>;

const INCH = 25.4;

// Page sizes: A4 is 210 × 297 mm (ISO 216); US Letter is 8.5 × 11 in (ANSI/ASME Y14.1).
const definitions = [
  {
    // Borderless A4 grid: 3 × 70 = 210 mm across, 8 × 37 = 296 mm down, 0.5 mm left top and bottom.
    id: 'a4-24',
    name: 'A4 sheet · 24 labels · 70 × 37 mm',
    page: { widthMm: 210, heightMm: 297 },
    marginsMm: { top: 0.5, right: 0, bottom: 0.5, left: 0 },
    columns: 3,
    rows: 8,
    label: { widthMm: 70, heightMm: 37 },
    pitchMm: { x: 70, y: 37 },
    // Office printers cannot print within ~3 mm of the sheet edge, and the outer labels touch it.
    paddingMm: 3,
  },
  {
    // Letter grid of 2⅝ × 1 in labels, 3 across with ⅛ in gutters, ½ in top/bottom, 3⁄16 in sides.
    id: 'letter-30',
    name: 'Letter sheet · 30 labels · 66.7 × 25.4 mm',
    page: { widthMm: 8.5 * INCH, heightMm: 11 * INCH },
    marginsMm: { top: 0.5 * INCH, right: (3 / 16) * INCH, bottom: 0.5 * INCH, left: (3 / 16) * INCH },
    columns: 3,
    rows: 10,
    label: { widthMm: 2.625 * INCH, heightMm: 1 * INCH },
    pitchMm: { x: 2.75 * INCH, y: 1 * INCH },
    paddingMm: 1.5,
  },
  {
    // Small thermal label printers feed one die-cut label per page.
    id: 'roll-50x25',
    name: 'Roll · single label · 50 × 25 mm',
    page: { widthMm: 50, heightMm: 25 },
    marginsMm: { top: 0, right: 0, bottom: 0, left: 0 },
    columns: 1,
    rows: 1,
    label: { widthMm: 50, heightMm: 25 },
    pitchMm: { x: 50, y: 25 },
    paddingMm: 1.5,
  },
] as const satisfies readonly Layout[];

/** Every layout, validated once at load so a bad edit fails loudly rather than printing off the page. */
export const LAYOUTS: readonly Layout[] = Object.freeze(definitions.map((d) => layoutSchema.parse(d)));

export type LayoutId = (typeof definitions)[number]['id'];
export const LAYOUT_IDS = definitions.map((d) => d.id) as [LayoutId, ...LayoutId[]];
export const layoutIdSchema = z.enum(LAYOUT_IDS);

export function getLayout(id: string): Layout | undefined {
  return LAYOUTS.find((l) => l.id === id);
}

export function labelsPerPage(layout: Layout): number {
  return layout.columns * layout.rows;
}

/** Top-left corner of every label slot on a page, in mm from the page's top-left, row by row. */
export function slotOrigins(layout: Layout): { xMm: number; yMm: number }[] {
  const slots: { xMm: number; yMm: number }[] = [];
  for (let row = 0; row < layout.rows; row++) {
    for (let col = 0; col < layout.columns; col++) {
      slots.push({
        xMm: layout.marginsMm.left + col * layout.pitchMm.x,
        yMm: layout.marginsMm.top + row * layout.pitchMm.y,
      });
    }
  }
  return slots;
}
