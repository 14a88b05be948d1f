import { describe, expect, it } from 'vitest';
import { PDFDocument } from 'pdf-lib';
import { PNG } from 'pngjs';
import {
  attachmentHeaders,
  cleanFilename,
  detectAttachmentType,
  MAX_ATTACHMENT_BYTES,
} from '@/lib/inventory/attachment-type';

// Signatures checked by file-type: PNG starts 89 50 4E 47 0D 0A 1A 0A (ISO/IEC 15948 / W3C PNG §5.2),
// PDF starts "%PDF-" (ISO 32000-1 §7.5.2), JPEG starts FF D8 FF (ITU-T T.81, Table B.1: SOI marker),
// WebP is a RIFF container with form type "WEBP" (RFC 9649, the RIFF file header).

function png(): Uint8Array {
  const img = new PNG({ width: 2, height: 2 });
  img.data.fill(200);
  return new Uint8Array(PNG.sync.write(img));
}

async function pdf(): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  doc.addPage([100, 100]);
  return doc.save();
}

const text = (s: string) => new TextEncoder().encode(s);

describe('detectAttachmentType', () => {
  it('accepts a real PNG and a real PDF by their bytes', async () => {
    expect(await detectAttachmentType(png())).toEqual({
      ok: true,
      mime: 'image/png',
      ext: 'png',
      image: true,
    });
    expect(await detectAttachmentType(await pdf())).toEqual({
      ok: true,
      mime: 'application/pdf',
      ext: 'pdf',
      image: false,
    });
  });

  it('accepts JPEG and WebP signatures', async () => {
    const jpeg = new Uint8Array([
      0xff,
      0xd8,
      0xff,
      0xe0,
      0x00,
      0x10,
      0x4a,
      0x46,
      0x49,
      0x46,
      0x00,
      0x01,
      ...new Array(64).fill(0),
    ]);
    expect(await detectAttachmentType(jpeg)).toMatchObject({ ok: true, mime: 'image/jpeg' });
    const webp = new Uint8Array([
      ...text('RIFF'),
      0x24,
      0,
      0,
      0,
      ...text('WEBPVP8 '),
      ...new Array(64).fill(0),
    ]);
    expect(await detectAttachmentType(webp)).toMatchObject({ ok: true, mime: 'image/webp' });
  });

  it('refuses a script, HTML and SVG whatever they are called', async () => {
    for (const body of [
      '<script>alert(1)</script>',
      '<!doctype html><html><body>hi</body></html>',
      '<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>',
    ]) {
      const r = await detectAttachmentType(text(body));
      expect(r.ok).toBe(false);
    }
  });

  it('refuses a known binary type that is not allowed (a ZIP)', async () => {
    const zip = new Uint8Array([0x50, 0x4b, 0x03, 0x04, ...new Array(60).fill(0)]);
    const r = await detectAttachmentType(zip);
    expect(r).toMatchObject({ ok: false, message: expect.stringContaining('ZIP') });
  });

  it('refuses an empty file and one over the cap', async () => {
    expect(await detectAttachmentType(new Uint8Array())).toEqual({ ok: false, message: 'the file is empty' });
    const big = new Uint8Array(MAX_ATTACHMENT_BYTES + 1);
    big.set(png());
    expect((await detectAttachmentType(big)).ok).toBe(false);
  });
});

describe('cleanFilename', () => {
  it('drops the path and control characters and puts the detected extension', () => {
    expect(cleanFilename('C:\\tmp\\..\\evil\u0007.html', 'png')).toBe('evil.png');
    expect(cleanFilename('datasheet.PDF', 'pdf')).toBe('datasheet.pdf');
    expect(cleanFilename('', 'jpg')).toBe('attachment.jpg');
  });
});

describe('attachmentHeaders', () => {
  it('sends images inline and everything else as a download, never sniffed, with no active content', () => {
    const img = attachmentHeaders('image/png', 'photo.png', 10);
    expect(img['Content-Disposition']).toMatch(/^inline;/);
    const doc = attachmentHeaders('application/pdf', 'spec sheet ü.pdf', 10);
    expect(doc['Content-Disposition']).toMatch(
      /^attachment; filename="spec sheet _.pdf"; filename\*=UTF-8''spec%20sheet%20%C3%BC\.pdf$/,
    );
    for (const h of [img, doc]) {
      expect(h['X-Content-Type-Options']).toBe('nosniff');
      expect(h['Content-Security-Policy']).toMatch(/^default-src 'none'/);
    }
  });
});
