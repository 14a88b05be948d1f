// What an uploaded file really is, from its bytes (never its name or the browser's claim).
// Pure module: the unit tests feed it buffers directly.
import { fileTypeFromBuffer } from 'file-type';

/** 5 MiB: a datasheet or a phone photo fits; the database does not fill with videos. */
export const MAX_ATTACHMENT_BYTES = 5 * 1024 * 1024;

export const ALLOWED_TYPES = {
  'application/pdf': 'pdf',
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/webp': 'webp',
} as const;
export type AllowedMime = keyof typeof ALLOWED_TYPES;

export type Detected =
  { ok: true; mime: AllowedMime; ext: string; image: boolean } | { ok: false; message: string };

/**
 * Accepts PDF, JPEG, PNG and WebP by their signatures. Text of any kind (HTML, SVG, scripts) has no
 * signature, so it is refused whatever its name says.
 */
export async function detectAttachmentType(bytes: Uint8Array): Promise<Detected> {
  if (bytes.byteLength === 0) return { ok: false, message: 'the file is empty' };
  if (bytes.byteLength > MAX_ATTACHMENT_BYTES)
    return { ok: false, message: `the file is larger than ${MAX_ATTACHMENT_BYTES / 1024 / 1024} MB` };
  const found = await fileTypeFromBuffer(bytes);
  if (!found || !(found.mime in ALLOWED_TYPES)) {
    const what = found
      ? `a ${found.ext.toUpperCase()} file`
      : 'not a recognised binary file (text, HTML or a script?)';
    return {
      ok: false,
      message: `only PDF datasheets and JPEG, PNG or WebP photos are accepted; this is ${what}`,
    };
  }
  const mime = found.mime as AllowedMime;
  return { ok: true, mime, ext: ALLOWED_TYPES[mime], image: mime.startsWith('image/') };
}

/** A file name safe to store and to put in a header: no path, no control characters, bounded, with the detected extension. */
export function cleanFilename(name: string, ext: string): string {
  const base = (name.split(/[\\/]/).pop() ?? '')
    .replace(/[\u0000-\u001f\u007f"]/g, '')
    .trim()
    .slice(0, 150);
  const stem = base.replace(/\.[A-Za-z0-9]{1,5}$/, '') || 'attachment';
  return `${stem}.${ext}`;
}

/** Headers for serving a stored file: the detected type, no sniffing, no active content, downloads for non-images. */
export function attachmentHeaders(mime: string, filename: string, size: number): Record<string, string> {
  const image = mime.startsWith('image/');
  const ascii = filename.replace(/[^\x20-\x7e]/g, '_').replace(/[\\"]/g, '_');
  return {
    'Content-Type': mime,
    'Content-Length': String(size),
    'Content-Disposition': `${image ? 'inline' : 'attachment'}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(filename)}`,
    'X-Content-Type-Options': 'nosniff',
    'Content-Security-Policy': "default-src 'none'; style-src 'unsafe-inline'; sandbox",
    'Cross-Origin-Resource-Policy': 'same-origin',
    'Cache-Control': 'private, max-age=3600',
  };
}
