import { z } from 'zod';

/** A message caught by the local mail catcher (`GET /api/dev/outbox`, development only). */
export const CaughtMessageSchema = z.object({
  id: z.string(),
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  html: z.string(),
  /** Lower-case header names to values, e.g. `list-unsubscribe` (api-contract.md). */
  headers: z.record(z.string(), z.string()),
  sent_at: z.string(),
});
export type CaughtMessage = z.infer<typeof CaughtMessageSchema>;

/** `GET /api/dev/outbox`: the messages the local catcher holds. */
export const OutboxAnswerSchema = z.object({ messages: z.array(CaughtMessageSchema) });
export type OutboxAnswer = z.infer<typeof OutboxAnswerSchema>;
