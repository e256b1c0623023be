/** The development outbox: what the in-process fake SMTP server received for one team. */
import { z } from 'zod';

const outboxMessageSchema = z.object({
  id: z.string(),
  to: z.array(z.string()),
  from: z.string(),
  subject: z.string(),
  text: z.string(),
  attachments: z.array(z.object({ filename: z.string(), contentType: z.string(), size: z.number().int(), sha256: z.string().optional() })),
  receivedAt: z.string(),
});
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;

export const outboxSchema = z.object({
  /** Always true: the outbox answers 404 when real SMTP (or no mail at all) is configured. */
  fake: z.literal(true),
  messages: z.array(outboxMessageSchema),
});
