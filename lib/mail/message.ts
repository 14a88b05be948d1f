import { z } from 'zod';

// The shape of one message as the SMTP sink stores it and serves it over HTTP.
// Shared by the sink (fakes/smtp) and the reader (lib/mail/mailbox.ts), so both agree on the wire format.
export const storedMessageSchema = z.object({
  id: z.string(),
  receivedAt: z.string(), // ISO 8601, UTC
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  html: z.string().nullable(),
  messageId: z.string().nullable(),
  /** Files sent with the message; text files keep their content so a reader (or a test) can open them. */
  attachments: z
    .array(z.object({ filename: z.string(), contentType: z.string(), size: z.number(), text: z.string().nullable() }))
    .optional(),
});

export type StoredMessage = z.infer<typeof storedMessageSchema>;
