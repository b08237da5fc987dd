// One message as the dev outbox (src/fakes/mail-server.ts) stores it and lists it to the app
// (src/server/mail.ts): the same shape on both sides.
import { z } from "zod";

export const outboxMessageSchema = z.object({
  id: z.uuid(),
  from: z.string(),
  to: z.array(z.string()),
  cc: z.array(z.string()),
  bcc: z.array(z.string()),
  replyTo: z.array(z.string()),
  subject: z.string(),
  html: z.string().nullable(),
  text: z.string().nullable(),
  headers: z.record(z.string(), z.string()),
  tags: z.array(z.object({ name: z.string(), value: z.string() })),
  createdAt: z.iso.datetime(),
});
