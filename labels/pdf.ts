// Printable label PDFs with exact millimetre geometry.
// Each label is drawn inside `q <label rectangle> re W n … Q`: the clip keeps a long name from ever
// printing onto the neighbour, and the rectangle is the label's true position on the page, which the
// tests read back from the PDF itself. The QR is vector rectangles (crisp at any printer resolution),
// with the 4-module quiet zone ISO/IEC 18004 asks for kept blank inside the label.
import QRCode from 'qrcode';
import { PDFDocument, PrintScaling, StandardFonts, type PDFFont, type PDFPage } from 'pdf-lib';
import { InvalidError, type FieldErrors } from '@/lib/errors';
import { formatCode } from './code';
import { getLayout, labelsPerPage, slotOrigins, type Layout } from './layouts';
import { pt, qrPath, rect, textLine } from './pdf-ops';
import { labelItemSchema, MAX_LABELS_PER_RUN, type LabelItem } from './schema';
import { drawable, truncateToWidth, wrapToWidth } from './text-fit';
import type { EcLevel } from './qr';

export type RenderLabelsOptions = {
  title?: string;
  /** Called as labels are laid out (at least once per page and at the end) with labels done so far. */
  onProgress?: (done: number, total: number) => void;
  /** Slots already used on the first sheet; printing starts after them (row by row from the top left). */
  skipSlots?: number;
  /** Stroke a hairline around each label: for a test print on plain paper held against a sheet. */
  outline?: boolean;
  ecLevel?: EcLevel;
};

/** ISO/IEC 18004 minimum quiet zone, in modules. */
export const QUIET_ZONE_MODULES = 4;
/** Hand the event loop back this often so a server stays responsive and a progress bar moves. */
const YIELD_EVERY_MS = 25;
// setImmediate (Node) returns to the event loop without setTimeout's 1–4 ms minimum delay.
const nextTurn: (fn: () => void) => void = globalThis.setImmediate ?? ((fn) => setTimeout(fn, 0));

type Fonts = { code: PDFFont; text: PDFFont; bold: PDFFont };
type FontKeys = { code: string; text: string; bold: string };

/** Sizes and offsets shared by every label of a layout, in points relative to the label's corner. */
type Geometry = {
  w: number;
  h: number;
  pad: number;
  qrSide: number;
  qrY: number;
  textX: number;
  textWidth: number;
  codeSize: number;
  nameSize: number;
  specSize: number;
  nameLines: number;
};

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));

function geometry(layout: Layout, fonts: Fonts): Geometry {
  const w = pt(layout.label.widthMm);
  const h = pt(layout.label.heightMm);
  const pad = pt(layout.paddingMm);
  const innerW = w - 2 * pad;
  const innerH = h - 2 * pad;
  const qrSide = Math.min(innerH, innerW * 0.55);
  const textX = pad + qrSide + pt(0.5);
  const textWidth = w - pad - textX;
  // Every code prints as 8 Courier characters, so one sample measures them all.
  const codeSize = clamp(Math.min(h * 0.15, textWidth / fonts.code.widthOfTextAtSize('0000-000', 1)), 5, 14);
  const nameSize = clamp(codeSize * 0.72, 5, 9);
  const specSize = clamp(nameSize * 0.92, 5, 8.5);
  // As many name lines (1–3) as leave the block (code, name lines, spec at 1.2 leading) within the label.
  const nameLines = clamp(Math.floor((innerH / 1.2 - codeSize - specSize) / nameSize), 1, 3);
  return {
    w,
    h,
    pad,
    qrSide,
    qrY: pad + (innerH - qrSide) / 2,
    textX,
    textWidth,
    codeSize,
    nameSize,
    specSize,
    nameLines,
  };
}

function labelContent(
  item: LabelItem,
  x: number,
  y: number,
  g: Geometry,
  fonts: Fonts,
  keys: FontKeys,
  opts: RenderLabelsOptions,
): string {
  const ops: string[] = ['q', `${rect(x, y, g.w, g.h)} W n`, '0 g'];
  if (opts.outline) ops.push(`0.6 G 0.25 w ${rect(x, y, g.w, g.h)} S`);

  const qr = QRCode.create(item.url, { errorCorrectionLevel: opts.ecLevel ?? 'M' });
  const qrX = x + g.pad;
  const qrY = y + g.qrY;
  ops.push(qrPath(qr.modules, qrX, qrY, g.qrSide, QUIET_ZONE_MODULES));

  // The text block starts level with the top of the QR symbol (inside its quiet zone).
  const moduleSize = g.qrSide / (qr.modules.size + 2 * QUIET_ZONE_MODULES);
  const tx = x + g.textX;
  let baseline =
    qrY +
    g.qrSide -
    QUIET_ZONE_MODULES * moduleSize -
    fonts.code.heightAtSize(g.codeSize, { descender: false });
  ops.push(
    textLine(keys.code, g.codeSize, tx, baseline, fonts.code.encodeText(formatCode(item.code)).toString()),
  );

  baseline -= 0.45 * g.codeSize + 1.15 * g.nameSize;
  for (const line of wrapToWidth(
    fonts.bold,
    drawable(fonts.bold, item.name),
    g.nameSize,
    g.textWidth,
    g.nameLines,
  )) {
    ops.push(textLine(keys.bold, g.nameSize, tx, baseline, fonts.bold.encodeText(line).toString()));
    baseline -= 1.15 * g.nameSize;
  }
  const spec = item.spec
    ? truncateToWidth(fonts.text, drawable(fonts.text, item.spec), g.specSize, g.textWidth)
    : '';
  if (spec) {
    baseline -= 0.15 * g.specSize;
    ops.push(textLine(keys.text, g.specSize, tx, baseline, fonts.text.encodeText(spec).toString()));
  }
  ops.push('Q');
  return ops.join('\n');
}

function validate(
  items: LabelItem[],
  layoutId: string,
  skipSlots: number,
): { layout: Layout; items: LabelItem[] } {
  const fields: FieldErrors = {};
  const layout = getLayout(layoutId);
  if (!layout) fields.layoutId = [`unknown layout "${layoutId}"`];
  if (items.length === 0) fields.items = ['choose at least one label to print'];
  if (items.length > MAX_LABELS_PER_RUN) fields.items = [`at most ${MAX_LABELS_PER_RUN} labels per run`];
  if (!Number.isInteger(skipSlots) || skipSlots < 0 || (layout && skipSlots >= labelsPerPage(layout))) {
    fields.skipSlots = [
      `must be a whole number below ${layout ? labelsPerPage(layout) : 'the labels per page'}`,
    ];
  }
  const parsed: LabelItem[] = [];
  items.forEach((item, i) => {
    const result = labelItemSchema.safeParse(item);
    if (result.success) parsed.push(result.data);
    else
      for (const issue of result.error.issues)
        (fields[['items', i, ...issue.path].join('.')] ??= []).push(issue.message);
  });
  if (Object.keys(fields).length || !layout)
    throw new InvalidError('These labels cannot be printed.', fields);
  return { layout, items: parsed };
}

function addPage(doc: PDFDocument, layout: Layout, fonts: Fonts): { page: PDFPage; keys: FontKeys } {
  const page = doc.addPage([pt(layout.page.widthMm), pt(layout.page.heightMm)]);
  const keys = {
    code: page.node.newFontDictionary('Code', fonts.code.ref).toString(),
    text: page.node.newFontDictionary('Text', fonts.text.ref).toString(),
    bold: page.node.newFontDictionary('Bold', fonts.bold.ref).toString(),
  };
  return { page, keys };
}

/**
 * A PDF of labels, filling pages of the layout row by row. Throws InvalidError (fields named, e.g.
 * `items.3.code`) for an unknown layout, no items, a bad code or URL, or too many labels.
 */
export async function renderLabelsPdf(
  items: LabelItem[],
  layoutId: string,
  opts: RenderLabelsOptions = {},
): Promise<Uint8Array> {
  const skipSlots = opts.skipSlots ?? 0;
  const { layout, items: labels } = validate(items, layoutId, skipSlots);
  const doc = await PDFDocument.create();
  const fonts: Fonts = {
    code: await doc.embedFont(StandardFonts.CourierBold),
    text: await doc.embedFont(StandardFonts.Helvetica),
    bold: await doc.embedFont(StandardFonts.HelveticaBold),
  };
  doc.setTitle(opts.title ?? `Labels (${labels.length}) · ${layout.name}`, { showInWindowTitleBar: true });
  doc.setCreator('Ohmstead');
  doc.setSubject(`${labels.length} labels, layout ${layout.id}`);
  // Geometry is exact only at 100 %: ask viewers not to shrink the page to fit the printer's margins.
  doc.catalog.getOrCreateViewerPreferences().setPrintScaling(PrintScaling.None);

  const g = geometry(layout, fonts);
  const slots = slotOrigins(layout);
  const pageHeight = pt(layout.page.heightMm);
  let slot = skipSlots;
  let lastYield = performance.now();
  for (let done = 0; done < labels.length;) {
    const { page, keys } = addPage(doc, layout, fonts);
    const ops: string[] = [];
    for (; slot < slots.length && done < labels.length; slot++, done++) {
      const { xMm, yMm } = slots[slot];
      ops.push(labelContent(labels[done], pt(xMm), pageHeight - pt(yMm) - g.h, g, fonts, keys, opts));
    }
    page.node.addContentStream(doc.context.register(doc.context.flateStream(ops.join('\n'))));
    slot = 0;
    opts.onProgress?.(done, labels.length);
    if (performance.now() - lastYield > YIELD_EVERY_MS) {
      await new Promise<void>((resolve) => nextTurn(resolve));
      lastYield = performance.now();
    }
  }
  return doc.save();
}
