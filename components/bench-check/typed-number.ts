// What a person types into a number field, read forgivingly but never guessed at: a comma works as the
// decimal mark ("3,2" is 3.2), spaces between digit groups are ignored ("300 000"), a typographic minus
// is a minus. Anything else that is not a plain decimal number is refused with a message for the field.

export type ParsedNumber =
  | { kind: 'empty' }
  | { kind: 'bad'; message: string }
  | { kind: 'number'; value: number; /** The text as read, when it differs from what was typed ("3.2"). */ readAs?: string };

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

export function parseTypedNumber(text: string): ParsedNumber {
  const compact = text.replace(/[\s\u00a0\u2009\u202f]/g, '').replace(/\u2212/g, '-');
  if (compact === '') return { kind: 'empty' };
  const commas = compact.split(',').length - 1;
  if (commas > 1 || (commas === 1 && compact.includes('.')))
    return { kind: 'bad', message: 'Use one decimal mark (. or ,) and no thousands separators, e.g. 1500.5' };
  const plain = compact.replace(',', '.');
  if (!NUMBER.test(plain)) return { kind: 'bad', message: 'Enter a number: digits, with . or , for decimals (e.g. 3.2)' };
  const value = Number(plain);
  if (!Number.isFinite(value)) return { kind: 'bad', message: 'That number is too large to work with' };
  return commas === 1 ? { kind: 'number', value, readAs: plain } : { kind: 'number', value };
}
