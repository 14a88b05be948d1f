import { describe, expect, it } from 'vitest';
import { saleRef } from '@/lib/sales/ref';
import { formatDateTimeWithZone, isoInZone, utcOffset } from '@/lib/zoned-time';

// Our short sale reference: the first 40 bits of the id in Crockford's Base32 (alphabet
// 0123456789ABCDEFGHJKMNPQRSTVWXYZ, from Crockford's published "Base32" encoding), worked by hand.
describe('saleRef', () => {
  it('encodes the first 40 bits, five bits a symbol, as two groups of four', () => {
    expect(saleRef('00000000-0000-4000-8000-000000000000')).toBe('0000-0000');
    expect(saleRef('00000000-0100-4000-8000-000000000000')).toBe('0000-0001'); // 0x0000000001
    expect(saleRef('00000000-2000-4000-8000-000000000000')).toBe('0000-0010'); // 0x20 = 32 = "10"
    expect(saleRef('00000000-1f00-4000-8000-000000000000')).toBe('0000-000Z'); // 31 = Z
    expect(saleRef('ffffffff-ff00-4000-8000-000000000000')).toBe('ZZZZ-ZZZZ');
    // 0x0b1f3f8e7d in bits: 0000 1011 0001 1111 0011 1111 1000 1110 0111 1101; in fives:
    // 00001 01100 01111 10011 11111 00011 10011 11101 = 1, 12, 15, 19, 31, 3, 19, 29 → 1 C F K Z 3 K X
    expect(saleRef('0b1f3f8e-7d7a-4f7e-9a51-0f0c2b7d1a11')).toBe('1CFK-Z3KX');
  });

  it('refuses what is not a sale id', () => {
    expect(() => saleRef('not-a-uuid')).toThrow();
  });
});

describe('times in the space’s zone', () => {
  it('writes ISO 8601 with the offset of that instant (daylight saving included)', () => {
    expect(isoInZone('2026-12-01T03:00:00.000Z', 'America/Chicago')).toBe('2026-11-30T21:00:00-06:00');
    expect(isoInZone('2026-07-01T03:00:00.000Z', 'America/Chicago')).toBe('2026-06-30T22:00:00-05:00');
    expect(isoInZone('2026-12-01T03:00:00.000Z', 'Asia/Kolkata')).toBe('2026-12-01T08:30:00+05:30');
    expect(isoInZone('2026-12-01T03:00:00.000Z', 'UTC')).toBe('2026-12-01T03:00:00+00:00');
  });

  it('names the zone and its offset beside the local time', () => {
    expect(utcOffset('2026-12-01T03:00:00.000Z', 'America/Chicago')).toBe('UTC−06:00');
    expect(formatDateTimeWithZone('2026-12-01T03:00:00.000Z', 'America/Chicago')).toBe(
      '30 Nov 2026, 21:00 (America/Chicago, UTC−06:00)',
    );
  });
});
