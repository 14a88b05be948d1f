import { z } from 'zod';

// Small response shapes for the API document. Services return richer records; these name the envelope
// each route answers with, so a client knows which key to read.
export const record = (description: string) => z.looseObject({}).meta({ description });
export const listOf = (key: string, description: string) =>
  z.object({ [key]: z.array(record(description)) });
export const one = (key: string, description: string) => z.object({ [key]: record(description) });
export const ok = z.object({ ok: z.literal(true) });

export const CSV = { contentType: 'text/csv', description: 'A CSV file (UTF-8), as a download.' };
