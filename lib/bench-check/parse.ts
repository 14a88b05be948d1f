import { z } from 'zod';
import { InvalidError, type FieldErrors } from '@/lib/errors';

// Parses a request body with a bench-check schema. An unknown key is named by its own path
// ("supply.kindd"), not by the object that holds it, so the person sees which word to fix.

export function issueFields(error: z.ZodError): FieldErrors {
  // A Map, not an object literal: a field may be called "constructor" or "__proto__".
  const fields = new Map<string, string[]>();
  const add = (path: PropertyKey[], message: string) => {
    const key = path.length ? path.map(String).join('.') : '(body)';
    fields.set(key, [...(fields.get(key) ?? []), message]);
  };
  for (const issue of error.issues) {
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) add([...issue.path, key], `Unknown field "${key}": remove it or check its spelling`);
    } else {
      add(issue.path, issue.message);
    }
  }
  return Object.fromEntries(fields);
}

/** Paths of own "__proto__" keys (JSON.parse makes them; zod's objects skip them without a word). */
function protoKeys(v: unknown, path: string[] = []): string[] {
  if (!v || typeof v !== 'object') return [];
  const here = Object.prototype.hasOwnProperty.call(v, '__proto__') ? [[...path, '__proto__'].join('.')] : [];
  return [...here, ...Object.entries(v).flatMap(([k, c]) => protoKeys(c, [...path, k]))];
}

/** The parsed value, or an InvalidError (400) whose fields name every bad input. */
export function parseBenchBody<T extends z.ZodType>(raw: unknown, schema: T): z.output<T> {
  const parsed = schema.safeParse(raw);
  const fields = parsed.success ? {} : issueFields(parsed.error);
  for (const key of protoKeys(raw)) // defineProperty: plain assignment to "__proto__" would set the prototype
    Object.defineProperty(fields, key, { value: ['Unknown field "__proto__": remove it'], enumerable: true, writable: true, configurable: true });
  if (parsed.success && Object.keys(fields).length === 0) return parsed.data;
  throw new InvalidError(`Check ${Object.keys(fields).join(', ')}.`, fields);
}

/** The body as JSON; anything else is a 400 naming "(body)". */
export async function readJson(req: Request): Promise<unknown> {
  let text: string;
  try {
    text = await req.text();
  } catch {
    throw new InvalidError('The body could not be read.', { '(body)': ['could not be read'] });
  }
  if (!text.trim()) throw new InvalidError('Send the build as a JSON object.', { '(body)': ['empty: send a JSON object'] });
  try {
    return JSON.parse(text);
  } catch {
    throw new InvalidError('The body is not valid JSON.', { '(body)': ['not valid JSON'] });
  }
}
