// Reading label output back independently of the code that wrote it: a small PDF content-stream
// reader (operators per PDF 32000-1 §7.8.2 / §8.5 / §9.4) and a rasteriser feeding jsQR, the
// independent ISO/IEC 18004 decoder.
import { inflateSync } from 'node:zlib';
import jsQR, { type QRCode } from 'jsqr';
import { PDFArray, PDFDocument, PDFName, PDFRawStream, type PDFPage } from 'pdf-lib';

export type Rect = { x: number; y: number; w: number; h: number };
export type TextRun = { font: string; size: number; x: number; y: number; text: string };
/** One `q <rect> re W n … Q` group: a label's clip rectangle and what is drawn inside it. */
export type LabelGroup = { clip: Rect; filled: Rect[]; texts: TextRun[] };

export const PT_PER_MM = 72 / 25.4;
export const toMm = (points: number) => points / PT_PER_MM;

/** The page's content streams, decoded (FlateDecode via node:zlib), concatenated. */
export function pageContent(doc: PDFDocument, page: PDFPage): string {
  const contents = page.node.Contents();
  const refs = contents instanceof PDFArray ? contents.asArray() : contents ? [contents] : [];
  return refs
    .map((ref) => {
      const stream = doc.context.lookup(ref);
      if (!(stream instanceof PDFRawStream)) throw new Error('unexpected content stream type');
      const filter = stream.dict.get(PDFName.of('Filter'));
      const bytes = filter === PDFName.of('FlateDecode') ? inflateSync(stream.contents) : stream.contents;
      return Buffer.from(bytes).toString('latin1');
    })
    .join('\n');
}

type Token =
  | { kind: 'num'; value: number }
  | { kind: 'name'; value: string }
  | { kind: 'hex'; value: string }
  | { kind: 'op'; value: string };

function tokenize(content: string): Token[] {
  const tokens: Token[] = [];
  const re = /<([0-9A-Fa-f\s]*)>|(\/[^\s/[\]()<>{}%]+)|([-+]?(?:\d+\.?\d*|\.\d+))|([A-Za-z'"*]+)|(\S)/g;
  for (const m of content.matchAll(re)) {
    if (m[1] !== undefined) tokens.push({ kind: 'hex', value: m[1].replace(/\s/g, '') });
    else if (m[2]) tokens.push({ kind: 'name', value: m[2] });
    else if (m[3]) tokens.push({ kind: 'num', value: Number(m[3]) });
    else if (m[4]) tokens.push({ kind: 'op', value: m[4] });
    else throw new Error(`unexpected token ${m[5]}`);
  }
  return tokens;
}

/** Current transformation matrix [a b c d e f] (PDF 32000-1 §8.3.3). */
type Matrix = [number, number, number, number, number, number];
const IDENTITY: Matrix = [1, 0, 0, 1, 0, 0];
/** `m cm` with CTM `c`: the new CTM is m × c (§8.4.4). */
const concat = (m: Matrix, c: Matrix): Matrix => [
  m[0] * c[0] + m[1] * c[2],
  m[0] * c[1] + m[1] * c[3],
  m[2] * c[0] + m[3] * c[2],
  m[2] * c[1] + m[3] * c[3],
  m[4] * c[0] + m[5] * c[2] + c[4],
  m[4] * c[1] + m[5] * c[3] + c[5],
];
const apply = (c: Matrix, x: number, y: number) => ({
  x: c[0] * x + c[2] * y + c[4],
  y: c[1] * x + c[3] * y + c[5],
});

/** A rectangle in user space → its bounding box on the page (exact for scale and translation). */
function toPage(c: Matrix, r: Rect): Rect {
  const corners = [apply(c, r.x, r.y), apply(c, r.x + r.w, r.y + r.h)];
  const x = Math.min(corners[0].x, corners[1].x);
  const y = Math.min(corners[0].y, corners[1].y);
  return { x, y, w: Math.abs(corners[1].x - corners[0].x), h: Math.abs(corners[1].y - corners[0].y) };
}

/** Labels on a page as clip groups, with their filled rectangles and text runs, in page coordinates. */
export function readLabels(content: string): LabelGroup[] {
  const groups: LabelGroup[] = [];
  let current: LabelGroup | null = null;
  let depth = 0;
  let ctm: Matrix = IDENTITY;
  const saved: Matrix[] = [];
  let path: Rect[] = [];
  let pendingClip = false;
  let font = '';
  let size = 0;
  let pos = { x: 0, y: 0 };
  let operands: Token[] = [];
  const nums = () => operands.map((t) => (t.kind === 'num' ? t.value : NaN));
  for (const token of tokenize(content)) {
    if (token.kind !== 'op') {
      operands.push(token);
      continue;
    }
    switch (token.value) {
      case 'q':
        depth++;
        saved.push(ctm);
        break;
      case 'Q':
        depth--;
        ctm = saved.pop() ?? IDENTITY;
        if (depth === 0) current = null;
        break;
      case 'cm':
        ctm = concat(nums() as Matrix, ctm);
        break;
      case 're': {
        const [x, y, w, h] = nums();
        path.push(toPage(ctm, { x, y, w, h }));
        break;
      }
      case 'W':
        pendingClip = true;
        break;
      case 'n':
        if (pendingClip && path.length === 1 && depth === 1) {
          current = { clip: path[0], filled: [], texts: [] };
          groups.push(current);
        }
        pendingClip = false;
        path = [];
        break;
      case 'f':
        current?.filled.push(...path);
        path = [];
        break;
      case 'S':
        path = [];
        break;
      case 'Tf':
        font = (operands[0] as { value: string }).value;
        size = nums()[1] * Math.sqrt(Math.abs(ctm[0] * ctm[3] - ctm[1] * ctm[2]));
        break;
      case 'Td': {
        const [x, y] = nums();
        pos = apply(ctm, x, y);
        break;
      }
      case 'Tj': {
        const hex = (operands[0] as { value: string }).value;
        current?.texts.push({ font, size, ...pos, text: Buffer.from(hex, 'hex').toString('latin1') });
        break;
      }
      default:
        break;
    }
    operands = [];
  }
  return groups;
}

/** Rasterise dark rectangles (PDF coordinates, y up) into an RGBA image and decode it with jsQR. */
export function decodeRects(rects: Rect[], area: Rect, pxPerPt: number): QRCode | null {
  const width = Math.ceil(area.w * pxPerPt);
  const height = Math.ceil(area.h * pxPerPt);
  const rgba = new Uint8ClampedArray(width * height * 4).fill(255);
  for (const r of rects) {
    const x0 = Math.round((r.x - area.x) * pxPerPt);
    const x1 = Math.round((r.x + r.w - area.x) * pxPerPt);
    const y0 = Math.round((area.y + area.h - (r.y + r.h)) * pxPerPt); // flip: image rows run downwards
    const y1 = Math.round((area.y + area.h - r.y) * pxPerPt);
    for (let row = Math.max(0, y0); row < Math.min(height, y1); row++) {
      for (let col = Math.max(0, x0); col < Math.min(width, x1); col++) {
        const i = (row * width + col) * 4;
        rgba[i] = rgba[i + 1] = rgba[i + 2] = 0;
      }
    }
  }
  return jsQR(rgba, width, height, { inversionAttempts: 'dontInvert' });
}

/** Bounding box of rectangles. */
export function bounds(rects: Rect[]): Rect {
  const x = Math.min(...rects.map((r) => r.x));
  const y = Math.min(...rects.map((r) => r.y));
  const right = Math.max(...rects.map((r) => r.x + r.w));
  const top = Math.max(...rects.map((r) => r.y + r.h));
  return { x, y, w: right - x, h: top - y };
}
