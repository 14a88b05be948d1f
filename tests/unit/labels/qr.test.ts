import { describe, expect, it } from 'vitest';
import jsQR from 'jsqr';
import { PNG } from 'pngjs';
import { encodeCode, newCode } from '@/labels/code';
import { codeFromScan, labelUrl, qrPng, qrSvg } from '@/labels/qr';

// ISO/IEC 18004 conformance is judged by an independent decoder (jsQR), not by the encoder's own
// reader: a PNG from qrPng is decoded with pngjs → RGBA → jsQR and must give back the exact URL.
function decodePng(png: Buffer): string | null {
  const image = PNG.sync.read(png);
  return jsQR(new Uint8ClampedArray(image.data), image.width, image.height)?.data ?? null;
}

// One code for each check symbol that is not a data symbol (values ≡ 32…36 mod 37).
const extraCheckCodes = [32, 33, 34, 35, 36].map((r) => encodeCode(37 * 1000 + r));

describe('labelUrl', () => {
  it('is <base>/s/<canonical code>, keeping a base path and dropping trailing slashes', () => {
    expect(labelUrl('https://bench.quillmere.example', 'k7f2-qx*')).toBe(
      'https://bench.quillmere.example/s/K7F2QX*',
    );
    expect(labelUrl('https://lab.fernwick.example/ohm/', 'K7F2QX*')).toBe(
      'https://lab.fernwick.example/ohm/s/K7F2QX*',
    );
  });

  it('refuses a bad base or a code that does not verify', () => {
    expect(() => labelUrl('bench.example', 'K7F2QX*')).toThrow(/absolute URL/);
    expect(() => labelUrl('ftp://bench.example', 'K7F2QX*')).toThrow(/http/);
    expect(() => labelUrl('https://bench.example/?a=1', 'K7F2QX*')).toThrow(/query/);
    expect(() => labelUrl('https://bench.example', 'K7F2QX~')).toThrow(/add up/);
  });

  it('keeps * ~ $ = U readable: the WHATWG URL parser leaves them as printed', () => {
    expect(extraCheckCodes.map((c) => c[6])).toEqual(['*', '~', '$', '=', 'U']);
    for (const code of extraCheckCodes) {
      const url = labelUrl('https://bench.quillmere.example', code);
      const parsed = new URL(url);
      expect(parsed.href).toBe(url);
      expect(parsed.pathname).toBe(`/s/${code}`);
    }
  });
});

describe('codeFromScan', () => {
  it('round-trips every check symbol through the URL, literal or percent-encoded', () => {
    for (const code of [...extraCheckCodes, newCode()]) {
      const url = labelUrl('https://bench.quillmere.example', code);
      expect(codeFromScan(url)).toEqual({ ok: true, code });
      const encoded = url.replace(/[^/]+$/, (segment) =>
        encodeURIComponent(segment).replace(/\*/g, '%2A').replace(/~/g, '%7E'),
      );
      expect(codeFromScan(encoded)).toEqual({ ok: true, code });
      expect(codeFromScan(`${url}/`)).toEqual({ ok: true, code });
    }
  });

  it('reads a typed or USB-scanned bare code, and reports a bad one', () => {
    expect(codeFromScan(' k7f2-qx* \n')).toEqual({ ok: true, code: 'K7F2QX*' });
    expect(codeFromScan('K7F2QX~')).toMatchObject({ ok: false, reason: 'check' });
    expect(codeFromScan('https://elsewhere.example/about')).toMatchObject({ ok: false, reason: 'empty' });
    expect(codeFromScan('https://bench.example/s/%E0%A4%A')).toMatchObject({ ok: false });
  });
});

describe('qrPng', () => {
  it('every generated label URL decodes back exactly with jsQR', async () => {
    const bases = [
      'https://bench.quillmere.example',
      'http://127.0.0.1:3000',
      'https://lab.fernwick.example/ohmstead',
    ];
    const codes = [...extraCheckCodes, ...Array.from({ length: 150 }, newCode)];
    for (const [i, code] of codes.entries()) {
      const url = labelUrl(bases[i % bases.length], code);
      expect(decodePng(await qrPng(url))).toBe(url);
    }
  });

  it('honours the error-correction level and quiet zone (4 light modules by default)', async () => {
    const url = labelUrl('https://bench.quillmere.example', 'K7F2QX*');
    const image = PNG.sync.read(await qrPng(url, { width: 300 }));
    expect(image.width).toBe(300);
    const high = PNG.sync.read(await qrPng(url, { ecLevel: 'H' }));
    const medium = PNG.sync.read(await qrPng(url));
    // H needs more modules than M for the same 41 bytes (ISO/IEC 18004 capacity table: version 3-M
    // holds 42 bytes, version 3-H only 24), so at 4 px per module the H image is larger.
    expect(high.width).toBeGreaterThan(medium.width);
    expect(decodePng(await qrPng(url, { ecLevel: 'H' }))).toBe(url);
    // The top-left 4 × 4 modules (16 × 16 px at scale 4) are the quiet zone: all light.
    for (let y = 0; y < 16; y++)
      for (let x = 0; x < 16; x++) expect(medium.data[(y * medium.width + x) * 4]).toBe(255);
  });
});

describe('qrSvg', () => {
  // Rasterise the SVG's module path (M/m/h commands on a 1-unit stroke) and decode it with jsQR.
  function decodeSvg(svg: string): string | null {
    const size = Number(/viewBox="0 0 (\d+) \1"/.exec(svg)?.[1]);
    const d = /<path stroke="[^"]+" d="([^"]+)"/.exec(svg)?.[1] ?? '';
    const scale = 6;
    const px = size * scale;
    const rgba = new Uint8ClampedArray(px * px * 4).fill(255);
    let x = 0;
    let y = 0;
    for (const [, cmd, a, b] of d.matchAll(/([MmHh])([-\d.]+)(?:\s([-\d.]+))?/g)) {
      if (cmd === 'M') [x, y] = [Number(a), Number(b)];
      else if (cmd === 'm') [x, y] = [x + Number(a), y + Number(b)];
      else {
        const end = cmd === 'h' ? x + Number(a) : Number(a);
        const row = Math.floor(y);
        for (let col = x; col < end; col++) {
          for (let sy = 0; sy < scale; sy++) {
            for (let sx = 0; sx < scale; sx++) {
              const i = ((row * scale + sy) * px + col * scale + sx) * 4;
              rgba[i] = rgba[i + 1] = rgba[i + 2] = 0;
            }
          }
        }
        x = end;
      }
    }
    return jsQR(rgba, px, px)?.data ?? null;
  }

  it('draws a scalable symbol with the quiet zone that decodes back to the URL', async () => {
    for (const code of [...extraCheckCodes, newCode(), newCode()]) {
      const url = labelUrl('https://bench.quillmere.example', code);
      const svg = await qrSvg(url, { width: 160 });
      expect(svg).toMatch(/^<svg [^>]*viewBox="0 0 \d+ \d+"/);
      expect(svg).toContain('width="160"');
      // Version 3 (29 modules, up to 42 bytes at level M) plus 4 + 4 quiet modules = 37.
      expect(svg).toContain('viewBox="0 0 37 37"');
      expect(decodeSvg(svg)).toBe(url);
    }
  });
});
