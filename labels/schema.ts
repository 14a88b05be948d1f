// Input shapes for printing labels: one place for the route handler, the server action and the form.
import { z } from 'zod';
import { isValidCode } from './code';
import { layoutIdSchema } from './layouts';

/** Upper bound per print run: keeps a single request's memory and time bounded (1,000 take about a second). */
export const MAX_LABELS_PER_RUN = 5000;

export const labelItemSchema = z.object({
  code: z.string().refine(isValidCode, { message: 'not a valid label code (check symbol does not match)' }),
  url: z.url({ protocol: /^https?$/ }).max(500),
  name: z.string().trim().min(1).max(200),
  spec: z.string().trim().max(200).optional(),
});
export type LabelItem = z.input<typeof labelItemSchema>;

export const labelRunSchema = z.object({
  layoutId: layoutIdSchema,
  items: z.array(labelItemSchema).min(1).max(MAX_LABELS_PER_RUN),
  /** Slots already used on the first sheet of a partly used sheet (row by row from the top left). */
  skipSlots: z.number().int().nonnegative().default(0),
});
