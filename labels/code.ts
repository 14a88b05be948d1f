// Label codes: six Crockford Base32 data symbols (30 random bits) plus Crockford's check symbol.
// Scheme: Douglas Crockford, "Base32", https://www.crockford.com/base32.html — 32 data symbols
// without I, L, O, U; on input I/L read as 1 and O as 0, case and hyphens ignored; the optional check
// symbol is the value modulo 37 (the smallest prime above 32), values 32–36 written * ~ $ = U.
// Modulo a prime above the alphabet size catches every single wrong symbol and every swap of two
// neighbours, which is what makes "did you mean" below exact rather than a guess.
//
// This module is pure (no Node or browser-only API beyond Web Crypto), so the scan page can import it.

export const DATA_SYMBOLS = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';
export const CHECK_SYMBOLS = DATA_SYMBOLS + '*~$=U';
export const DATA_LENGTH = 6;
export const CODE_LENGTH = DATA_LENGTH + 1;
/** 32^6 = 2^30 distinct codes. */
export const CODE_SPACE = 32 ** DATA_LENGTH;

export type CodeProblem = 'empty' | 'length' | 'symbol' | 'check';
export type CodeCheck = { ok: true; code: string } | { ok: false; reason: CodeProblem; message: string };

const MESSAGES: Record<CodeProblem, string> = {
  empty: 'Type the code printed under the QR.',
  length: `A label code has ${CODE_LENGTH} characters (hyphens and spaces do not count).`,
  symbol: 'That code has a character labels never use.',
  check: 'That code does not add up; check each character (did you mean one of the suggestions?).',
};

/** The check symbol of a data value (0 ≤ value < 2^30). */
export function checkSymbol(value: number): string {
  return CHECK_SYMBOLS[value % 37];
}

/** Encode 0 ≤ n < 2^30 as six data symbols (zero-padded) plus the check symbol. */
export function encodeCode(n: number): string {
  if (!Number.isInteger(n) || n < 0 || n >= CODE_SPACE) {
    throw new RangeError(`encodeCode: n must be an integer in [0, ${CODE_SPACE}), got ${n}`);
  }
  let data = '';
  for (let rest = n, i = 0; i < DATA_LENGTH; i++, rest = Math.floor(rest / 32)) {
    data = DATA_SYMBOLS[rest % 32] + data;
  }
  return data + checkSymbol(n);
}

/** A fresh random code from the platform's cryptographic generator (Web Crypto, Node ≥ 19 and browsers). */
export function newCode(): string {
  const word = new Uint32Array(1);
  globalThis.crypto.getRandomValues(word);
  return encodeCode(word[0] & (CODE_SPACE - 1));
}

/**
 * Crockford's reading rules without judging the result: upper-case, drop separators (hyphens, white
 * space, dots, underscores, slashes, middle dots — whatever a phone keyboard offers first), read I/L as
 * 1 and O as 0. Characters outside the alphabet are kept so callers can point at them.
 */
export function looseNormalize(input: string): string {
  return input
    .toUpperCase()
    .replace(/[\s\-–—._/·]+/g, '')
    .replace(/[IL]/g, '1')
    .replace(/O/g, '0');
}

function dataValue(data: string): number | null {
  let value = 0;
  for (const ch of data) {
    const digit = DATA_SYMBOLS.indexOf(ch);
    if (digit < 0) return null;
    value = value * 32 + digit;
  }
  return value;
}

/** Canonical form of a typed or scanned code: 7 characters, upper case, no hyphen. */
export type NormalizeResult =
  { ok: true; code: string } | { ok: false; reason: Exclude<CodeProblem, 'check'>; message: string };

function problem<R extends CodeProblem>(reason: R) {
  return { ok: false as const, reason, message: MESSAGES[reason] };
}

/**
 * Apply the reading rules and check the shape (length, alphabet, U only as the check symbol) but not
 * the check symbol itself — `verifyCode` does that.
 */
export function normalizeCode(input: string): NormalizeResult {
  let code = looseNormalize(input);
  if (code === '') return problem('empty');
  // The check symbols * ~ $ = are awkward on a phone keyboard: the six data symbols alone are read as
  // the code whose check is one of those. A code whose check is a letter or digit still needs it typed.
  if (code.length === DATA_LENGTH) {
    const value = dataValue(code);
    if (value !== null && '*~$='.includes(checkSymbol(value))) code += checkSymbol(value);
  }
  if (code.length !== CODE_LENGTH) return problem('length');
  // U is a check symbol only; in a data position it is as foreign as '#'.
  if (dataValue(code.slice(0, DATA_LENGTH)) === null || !CHECK_SYMBOLS.includes(code[DATA_LENGTH])) {
    return problem('symbol');
  }
  return { ok: true, code };
}

/** Normalise and verify the check symbol. Never throws. */
export function verifyCode(input: string): CodeCheck {
  const shaped = normalizeCode(input);
  if (!shaped.ok) return shaped;
  const value = dataValue(shaped.code.slice(0, DATA_LENGTH)) as number;
  return checkSymbol(value) === shaped.code[DATA_LENGTH] ? shaped : problem('check');
}

/** True when the input reads as a code with a correct check symbol. */
export function isValidCode(input: string): boolean {
  return verifyCode(input).ok;
}

/** For display and print: `K7F2-QX9` (a group of four, then three). Throws on a code that does not verify. */
/** The grouping people read: four symbols, a hyphen, the rest. */
const dashed = (code: string) => `${code.slice(0, 4)}-${code.slice(4)}`;

export function formatCode(code: string): string {
  const result = verifyCode(code);
  if (!result.ok) throw new RangeError(`formatCode: ${result.message}`);
  return dashed(result.code);
}

/**
 * "Did you mean": every code with a correct check symbol that is one substituted character or one
 * swap of neighbouring characters away from what was typed. Because the check is modulo a prime
 * above 32, each position admits at most one correcting substitution, so the list is naturally
 * bounded (≤ 7 substitutions + 6 swaps = 13); `limit` trims it further. Substitutions come first,
 * left to right, then swaps. A code that already verifies has no neighbours and gets [].
 */
export function suggestCodes(input: string, limit = 13): string[] {
  const typed = looseNormalize(input);
  if (typed.length !== CODE_LENGTH || isValidCode(typed)) return [];
  const found = new Set<string>();
  const consider = (candidate: string) => {
    if (candidate !== typed && isValidCode(candidate)) found.add(candidate);
  };
  for (let i = 0; i < CODE_LENGTH; i++) {
    const symbols = i < DATA_LENGTH ? DATA_SYMBOLS : CHECK_SYMBOLS;
    for (const s of symbols) consider(typed.slice(0, i) + s + typed.slice(i + 1));
  }
  for (let i = 0; i + 1 < CODE_LENGTH; i++) {
    consider(typed.slice(0, i) + typed[i + 1] + typed[i] + typed.slice(i + 2));
  }
  return [...found].slice(0, Math.max(0, limit));
}

/** The one displayed form of a code (`K7F2-QX9`) for any screen; a code that does not verify shows as stored. */
export function displayCode(code: string): string {
  const result = verifyCode(code);
  return result.ok ? dashed(result.code) : code;
}
