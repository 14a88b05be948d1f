import { expect, test } from 'vitest';
import { shortName } from '@/lib/short-name';

// The lend button says whom it lends to ("Lend to Ada L.", issue 12).
test.each([
  ['Ada Lindqvist', 'Ada L.'],
  ['  Wren   van der Copperfield ', 'Wren C.'],
  ['Oriel', 'Oriel'],
  ['Émile Ølstad', 'Émile Ø.'],
  ['', ''],
])('%j → %j', (full, short) => expect(shortName(full)).toBe(short));
