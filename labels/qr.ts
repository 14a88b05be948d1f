// QR symbols for screens (SVG) and for tests and downloads (PNG), drawn by the `qrcode` package.
// qrPng needs Node (the package writes PNG through pngjs); qrSvg runs anywhere.
import QRCode from 'qrcode';

export { labelUrl, codeFromScan } from './url';

export type EcLevel = 'L' | 'M' | 'Q' | 'H';

export type QrOptions = {
  /** Error-correction level; M (about 15 % recoverable) suits paper labels that get scuffed. */
  ecLevel?: EcLevel;
  /** Quiet zone in modules; ISO/IEC 18004 asks for at least 4, so that is the default. */
  margin?: number;
  /** SVG: rendered width in px (the viewBox keeps it scalable). PNG: image width in px. */
  width?: number;
  /** Dark and light colours as #rrggbb or #rrggbbaa. */
  dark?: string;
  light?: string;
};

function qrcodeOptions(opts: QrOptions) {
  return {
    errorCorrectionLevel: opts.ecLevel ?? 'M',
    margin: opts.margin ?? 4,
    ...(opts.width === undefined ? {} : { width: opts.width }),
    color: { dark: opts.dark ?? '#000000ff', light: opts.light ?? '#ffffffff' },
  } as const;
}

/** An SVG document string for inline use on screens. */
export function qrSvg(text: string, opts: QrOptions = {}): Promise<string> {
  return QRCode.toString(text, { ...qrcodeOptions(opts), type: 'svg' });
}

/** A PNG image. Without `width`, each module is 4 px. */
export function qrPng(text: string, opts: QrOptions = {}): Promise<Buffer> {
  const base = qrcodeOptions(opts);
  return QRCode.toBuffer(text, { ...base, type: 'png', ...(opts.width === undefined ? { scale: 4 } : {}) });
}
