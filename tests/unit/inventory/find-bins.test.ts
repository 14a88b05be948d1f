import { describe, expect, test } from 'vitest';
import { encodeCode, formatCode } from '@/labels/code';
import { findBins, pickBin } from '@/lib/inventory/find-bins';

// The count screen finds a bin by any part of its name or code (issue 12: "C1", "Bin C1" and
// "consumables" were refused; only the exact name or the code was found).
const bins = [
  { id: 'a1', name: 'Bin A1 · drivers', code: encodeCode(123_456_789) },
  { id: 'c1', name: 'Bin C1 · consumables', code: encodeCode(987_654_321) },
  { id: 'c10', name: 'Bin C10 · spare consumables', code: encodeCode(555_555_555) },
  { id: 'k', name: 'Shelf K · tools and kit boxes', code: null },
];

describe('findBins / pickBin', () => {
  test.each(['C1', 'c1', 'Bin C1', 'bin c1', 'Bin C1 · consumables', ' C1 consumables '])(
    '"%s" picks Bin C1',
    (typed) => {
      expect(pickBin(bins, typed).bin?.id).toBe('c1');
    },
  );

  test('"consumables" finds both bins that hold consumables, whole-word matches first, and picks none', () => {
    const { bin, candidates } = pickBin(bins, 'consumables');
    expect(bin).toBeNull();
    expect(candidates.map((b) => b.id)).toEqual(['c1', 'c10']);
  });

  test('part of a word finds it too ("consum", "tool")', () => {
    expect(findBins(bins, 'tool').map((b) => b.id)).toEqual(['k']);
    expect(findBins(bins, 'consum').map((b) => b.id)).toEqual(['c1', 'c10']);
  });

  test('the label code, scanned or typed any way, finds its bin', () => {
    const code = bins[0].code ?? '';
    for (const typed of [
      code,
      code.toLowerCase(),
      formatCode(code),
      `http://example.test/s/${code}`,
      code.slice(0, 5),
    ])
      expect(pickBin(bins, typed).bin?.id).toBe('a1');
  });

  test('nothing typed or nothing like it finds nothing', () => {
    expect(findBins(bins, '')).toEqual([]);
    expect(findBins(bins, 'Z9')).toEqual([]);
  });
});
