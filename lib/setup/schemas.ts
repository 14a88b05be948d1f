import { z } from 'zod';
import { emailSchema, passwordSchema, personNameSchema } from '@/lib/people/schema';
import { settingsSchema } from '@/lib/settings/schema';

// The first-run form: the first space's name, currency, time zone and closing time (the same rules as
// Settings), and its first admin.
export const firstRunSchema = z
  .object({
    spaceName: settingsSchema.shape.name,
    currency: settingsSchema.shape.currency,
    timeZone: settingsSchema.shape.timeZone,
    closingTime: settingsSchema.shape.closingTime,
    adminName: personNameSchema,
    adminEmail: emailSchema,
    password: passwordSchema,
  })
  .strict();
export type FirstRunInput = z.infer<typeof firstRunSchema>;
