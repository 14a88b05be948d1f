// Shared param schemas. Form values arrive as strings, so integers are parsed from digits only
// (the processor answers "Invalid integer" for anything else rather than guessing).
import { z } from 'zod';

export const intString = z
  .string()
  .regex(/^-?\d+$/, 'Invalid integer')
  .transform((s) => Number(s));

export const positiveInt = intString.refine((n) => n > 0, 'Must be a positive integer');
export const nonNegativeInt = intString.refine((n) => n >= 0, 'Must be zero or more');

export const currency = z
  .string()
  .regex(/^[A-Za-z]{3}$/, 'Must be a three-letter ISO 4217 code')
  .transform((s) => s.toLowerCase());

/** The processor's metadata limits: 50 keys, keys up to 40 characters, values up to 500. */
export const metadata = z
  .record(z.string().max(40), z.string().max(500))
  .refine((m) => Object.keys(m).length <= 50, 'At most 50 keys')
  .transform((m) => Object.fromEntries(Object.entries(m).filter(([, v]) => v !== '')));

export const expand = z.array(z.string()).optional();

/** Retrieve endpoints take nothing but `expand`. */
export const retrieveParams = z.object({ expand }).strict();
