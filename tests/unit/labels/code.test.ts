import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  CHECK_SYMBOLS,
  CODE_SPACE,
  DATA_SYMBOLS,
  checkSymbol,
  encodeCode,
  formatCode,
  isValidCode,
  newCode,
  normalizeCode,
  suggestCodes,
  verifyCode,
} from '@/labels/code';

// Source for every expectation in this file: Douglas Crockford, "Base32",
// https://www.crockford.com/base32.html — symbol set 0-9 A-Z without I L O U (values 0–31); on
// decoding, i/I/l/L mean 1 and o/O mean 0, upper and lower case are equal, hyphens are ignored;
// the check symbol is the number modulo 37, with 32–36 written * ~ $ = U.

describe('alphabet', () => {
  it('is the published 32 symbols plus the five check-only symbols', () => {
    expect(DATA_SYMBOLS).toBe('0123456789ABCDEFGHJKMNPQRSTVWXYZ');
    expect(CHECK_SYMBOLS).toBe('0123456789ABCDEFGHJKMNPQRSTVWXYZ*~$=U');
    for (const excluded of 'ILOU') expect(DATA_SYMBOLS).not.toContain(excluded);
  });
});

describe('check symbol (worked by hand)', () => {
  it.each([
    // data    value                     value mod 37                 check
    ['000000', 0, '0'], // 0 mod 37 = 0 → "0"
    ['00000Z', 31, 'Z'], // Z = 31; 31 mod 37 = 31 → "Z"
    ['000010', 32, '*'], // 1·32 = 32 → the first extra check symbol "*"
    ['000011', 33, '~'], // 32 + 1 = 33 → "~"
    ['000012', 34, '$'], // 34 → "$"
    ['000013', 35, '='], // 35 → "="
    ['000014', 36, 'U'], // 36 → "U", the only place U may appear
    ['000015', 37, '0'], // 37 mod 37 = 0 → "0" again
    // K=19 7 F=15 2 Q=23 X=29: 19·32⁵ + 7·32⁴ + 15·32³ + 2·32² + 23·32 + 29
    //   = 637534208 + 7340032 + 491520 + 2048 + 736 + 29 = 645368573
    //   = 37 · 17442393 (= 645368541) + 32 → "*"
    ['K7F2QX', 645368573, '*'],
    // ZZZZZZ = 2³⁰ − 1 = 1073741823. 2⁵ = 32 ≡ −5, 2¹⁰ ≡ 25, 2²⁰ ≡ 625 − 16·37 = 33,
    //   2³⁰ ≡ 33·25 = 825 − 22·37 = 11, so 2³⁰ − 1 ≡ 10 → "A"
    ['ZZZZZZ', CODE_SPACE - 1, 'A'],
  ])('%s (= %i) → %s', (data, value, check) => {
    expect(checkSymbol(value)).toBe(check);
    expect(encodeCode(value)).toBe(data + check);
    expect(verifyCode(data + check)).toEqual({ ok: true, code: data + check });
  });

  it('rejects a data value outside 30 bits', () => {
    expect(() => encodeCode(CODE_SPACE)).toThrow(RangeError);
    expect(() => encodeCode(-1)).toThrow(RangeError);
    expect(() => encodeCode(1.5)).toThrow(RangeError);
  });
});

describe('newCode', () => {
  it('makes 7-character codes that verify, from the data alphabet plus a check symbol', () => {
    const codes = Array.from({ length: 2000 }, newCode);
    for (const code of codes) {
      expect(code).toMatch(/^[0-9A-HJKMNP-TV-Z]{6}[0-9A-HJKMNP-TV-Z*~$=U]$/);
      expect(isValidCode(code)).toBe(true);
    }
    // 2000 draws from 2^30: a collision has probability ≈ 2000²/2^31 ≈ 0.2 %; a broken generator repeats.
    expect(new Set(codes).size).toBeGreaterThan(1995);
  });
});

describe('normalisation (Crockford decoding rules)', () => {
  it('ignores case, hyphens and spaces', () => {
    expect(normalizeCode(' k7f2-qx* ')).toEqual({ ok: true, code: 'K7F2QX*' });
    expect(normalizeCode('K7F 2QX-*')).toEqual({ ok: true, code: 'K7F2QX*' });
    expect(normalizeCode('00001-4u')).toEqual({ ok: true, code: '000014U' });
  });

  it('reads I and L as 1, O as 0', () => {
    // "1O0L1I" → 100111 = 32⁵ + 32² + 32 + 1 = 33555489 ≡ 20 + 25 − 5 + 1 = 41 ≡ 4 (mod 37) → check "4"
    expect(normalizeCode('1O0-L1I4')).toEqual({ ok: true, code: '1001114' });
    expect(verifyCode('io0-l1i4')).toEqual({ ok: true, code: '1001114' });
  });

  it('rejects U in a data position and foreign characters, naming the reason', () => {
    expect(normalizeCode('U00014U')).toMatchObject({ ok: false, reason: 'symbol' });
    expect(normalizeCode('00#014U')).toMatchObject({ ok: false, reason: 'symbol' });
    expect(normalizeCode('0000146')).toEqual({ ok: true, code: '0000146' }); // shape fine; check is verifyCode's job
  });

  it('rejects empty input and wrong lengths', () => {
    expect(normalizeCode('  - ')).toMatchObject({ ok: false, reason: 'empty' });
    expect(normalizeCode('000014')).toMatchObject({ ok: false, reason: 'length' });
    expect(normalizeCode('000014UU')).toMatchObject({ ok: false, reason: 'length' });
  });

  it('verifyCode reports a wrong check symbol with a message', () => {
    const result = verifyCode('K7F2QX~');
    expect(result).toMatchObject({ ok: false, reason: 'check' });
    expect(!result.ok && result.message).toMatch(/does not add up/);
  });

  it('round-trips every value through display format and lower case', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: CODE_SPACE - 1 }), (n) => {
        const code = encodeCode(n);
        const shown = formatCode(code);
        expect(shown).toMatch(/^.{4}-.{3}$/);
        expect(verifyCode(shown.toLowerCase())).toEqual({ ok: true, code });
      }),
    );
  });

  it('formatCode groups 4-3 and refuses a code that does not verify', () => {
    expect(formatCode('k7f2qx*')).toBe('K7F2-QX*');
    expect(() => formatCode('K7F2QX~')).toThrow(RangeError);
  });
});

describe('error detection (mod 37, 37 prime > 32)', () => {
  it('catches every single substitution and every neighbour swap', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: CODE_SPACE - 1 }), (n) => {
        const code = encodeCode(n);
        for (let i = 0; i < code.length; i++) {
          for (const s of i < 6 ? DATA_SYMBOLS : CHECK_SYMBOLS) {
            if (s !== code[i]) expect(isValidCode(code.slice(0, i) + s + code.slice(i + 1))).toBe(false);
          }
        }
        for (let i = 0; i + 1 < code.length; i++) {
          const swapped = code.slice(0, i) + code[i + 1] + code[i] + code.slice(i + 2);
          if (swapped !== code) expect(isValidCode(swapped)).toBe(false);
        }
      }),
      { numRuns: 200 },
    );
  });
});

describe('suggestCodes ("did you mean")', () => {
  const sample = ['K7F2QX*', '000014U', 'ZZZZZZA', encodeCode(123456789), newCode(), newCode()];

  it.each(sample)('finds %s again from every single-character typo', (code) => {
    for (let i = 0; i < code.length; i++) {
      // Every symbol a person could press instead, including ones labels never use.
      for (const s of CHECK_SYMBOLS + '#') {
        if (s === code[i]) continue;
        const typo = code.slice(0, i) + s + code.slice(i + 1);
        const suggestions = suggestCodes(typo);
        expect(suggestions, `typo ${typo}`).toContain(code);
        expect(suggestions.length).toBeLessThanOrEqual(13);
        for (const suggestion of suggestions) expect(isValidCode(suggestion)).toBe(true);
      }
    }
  });

  it.each(sample)('finds %s again from every neighbour swap, typed with a hyphen in lower case', (code) => {
    for (let i = 0; i + 1 < code.length; i++) {
      if (code[i] === code[i + 1]) continue;
      const swapped = code.slice(0, i) + code[i + 1] + code[i] + code.slice(i + 2);
      const typed = `${swapped.slice(0, 4)}-${swapped.slice(4)}`.toLowerCase();
      expect(suggestCodes(typed), `swap ${typed}`).toContain(code);
    }
  });

  it('offers nothing for a correct code or the wrong length, and honours the limit', () => {
    expect(suggestCodes('K7F2QX*')).toEqual([]);
    expect(suggestCodes('K7F2QX')).toEqual([]);
    const many = suggestCodes('K7F2QX~');
    expect(many.length).toBeGreaterThan(2);
    expect(suggestCodes('K7F2QX~', 2)).toEqual(many.slice(0, 2));
  });

  it('a fix of the check symbol alone is among the suggestions', () => {
    expect(suggestCodes('K7F2QX~')).toContain('K7F2QX*');
  });
});

describe('typing a code on a phone (issue 12)', () => {
  // Crockford's reading rules plus two of our own: any common separator is ignored, and when the check
  // symbol is one of * ~ $ = (hard to reach on a phone keyboard) the six data symbols alone suffice.
  it('accepts lower case and any separators', () => {
    const code = encodeCode(123_456_789);
    const [a, b] = [code.slice(0, 4), code.slice(4)];
    for (const typed of [code.toLowerCase(), `${a}-${b}`, `${a} ${b}`, `${a}.${b}`, `${a}_${b}`, `${a}/${b}`, ` ${a.toLowerCase()}–${b} `])
      expect(verifyCode(typed)).toEqual({ ok: true, code });
  });

  it('reads six data symbols as the code when its check symbol is * ~ $ or =', () => {
    let found = 0;
    for (let n = 1000; found < 4; n++) {
      const code = encodeCode(n);
      const check = code[6];
      if (!'*~$='.includes(check)) continue;
      found++;
      expect(verifyCode(code.slice(0, 6))).toEqual({ ok: true, code });
      expect(verifyCode(`${code.slice(0, 4)}-${code.slice(4, 6)}`.toLowerCase())).toEqual({ ok: true, code });
    }
  });

  it('still asks for the check symbol when it is a letter or digit', () => {
    const code = encodeCode(36); // check symbol U
    expect(code[6]).toBe('U');
    expect(normalizeCode(code.slice(0, 6))).toMatchObject({ ok: false, reason: 'length' });
  });
});
