import { describe, expect, test } from 'vitest';
import { safeCallbackUrl, safeNextPath } from '@/lib/auth/safe-next';

// The one rule for every `next` / callback URL: only a path of this site, after parsing it as a URL.

describe('safeNextPath', () => {
  test.each([
    ['/loans', '/loans'],
    ['/loans?status=out#top', '/loans?status=out#top'],
    ['/kits/abc/../def', '/kits/def'],
    ['/loans?next=%2Fshelf', '/loans?next=%2Fshelf'],
  ])('keeps %s', (raw, kept) => {
    expect(safeNextPath(raw)).toBe(kept);
  });

  test.each([
    '/\\evil.example',
    '\\evil.example',
    '/\\/evil.example',
    '/%5Cevil.example',
    '/%5cevil.example',
    '//evil.example',
    '%2F%2Fevil.example',
    '/%2F%2Fevil.example',
    '/%2f/evil.example',
    '/\t/evil.example',
    '\t//evil.example',
    '/\n/evil.example',
    '/%09/evil.example',
    '/\u0000/evil',
    'HTTPS://evil.example',
    'https://evil.example/',
    'http:evil.example',
    'javascript:alert(1)',
    'JaVaScRiPt:alert(1)',
    ' /loans',
    'loans',
    '',
    '/%E0%A4%A', // malformed escape
    'x'.repeat(3000),
  ])('refuses %j and falls back to the home page', (raw) => {
    expect(safeNextPath(raw)).toBe('/today');
  });

  test('anything that is not a string falls back', () => {
    for (const raw of [undefined, null, 42, ['/loans'], { a: 1 }]) expect(safeNextPath(raw)).toBe('/today');
  });
});

describe('safeCallbackUrl (next-auth redirect callback)', () => {
  const base = 'https://bench.example';
  test.each([
    ['/loans', 'https://bench.example/loans'],
    ['https://bench.example/kits?x=1', 'https://bench.example/kits?x=1'],
    ['https://BENCH.example/kits', 'https://bench.example/kits'],
    ['https://evil.example/kits', 'https://bench.example/today'],
    ['https://bench.example.evil.example/', 'https://bench.example/today'],
    ['http://bench.example/loans', 'https://bench.example/today'],
    ['/\\evil.example', 'https://bench.example/today'],
    ['https://bench.example//evil.example', 'https://bench.example/today'],
    ['javascript:alert(1)', 'https://bench.example/today'],
  ])('%s → %s', (url, expected) => {
    expect(safeCallbackUrl(url, base)).toBe(expected);
  });
});
