// Raw PDF content-stream operators for one label. Written as text rather than through pdf-lib's
// drawing calls: a thousand labels carry a few hundred thousand QR rectangles, and one string per
// page is far cheaper than an operator object per rectangle.

/** Millimetres to PDF points (1 pt = 1/72 in, 1 in = 25.4 mm). */
export const MM_TO_PT = 72 / 25.4;
export const pt = (mm: number): number => mm * MM_TO_PT;

/** A number as content-stream text: three decimals (1/1000 pt ≈ 0.35 µm) without trailing zeros. */
export function num(value: number, decimals = 3): string {
  const s = value.toFixed(decimals);
  return s.includes('.') ? s.replace(/\.?0+$/, '') : s;
}

/** A rectangle path: x y width height re (PDF 32000-1 §8.5.2.1). */
export function rect(x: number, y: number, w: number, h: number): string {
  return `${num(x)} ${num(y)} ${num(w)} ${num(h)} re`;
}

type ModuleMatrix = { size: number; data: Uint8Array };

/**
 * The dark modules of a QR symbol as one filled path. `x, y` is the bottom-left corner and `side` the
 * width of the whole symbol including its quiet zone of `quiet` modules (light, so not drawn).
 * The path is written in module units under a `cm` scale (PDF 32000-1 §8.4.4), so every rectangle is
 * a handful of small integers: a quarter of the bytes to build and compress compared with points.
 * Horizontal runs of dark modules merge into one rectangle; all rectangles share a single fill so
 * renderers show no seams between touching modules.
 */
export function qrPath(matrix: ModuleMatrix, x: number, y: number, side: number, quiet: number): string {
  const n = matrix.size;
  const m = side / (n + 2 * quiet);
  const parts: string[] = [`q ${num(m, 6)} 0 0 ${num(m, 6)} ${num(x)} ${num(y)} cm`];
  for (let row = 0; row < n; row++) {
    const bottom = quiet + n - 1 - row; // module rows count down from the top; PDF y counts up
    let col = 0;
    while (col < n) {
      if (!matrix.data[row * n + col]) {
        col++;
        continue;
      }
      const start = col;
      while (col < n && matrix.data[row * n + col]) col++;
      parts.push(`${quiet + start} ${bottom} ${col - start} 1 re`);
    }
  }
  parts.push('f Q');
  return parts.join('\n');
}

/** One line of text at a baseline; `fontKey` is the resource name (with its slash), `hex` from PDFFont.encodeText. */
export function textLine(fontKey: string, size: number, x: number, baseline: number, hex: string): string {
  return `BT ${fontKey} ${num(size)} Tf ${num(x)} ${num(baseline)} Td ${hex} Tj ET`;
}
