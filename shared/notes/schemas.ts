import { z } from 'zod';

/** A runner may flag a note as being about pain or illness; the coach is then told at once. */
export const NoteConcernSchema = z.enum(['pain', 'illness'], {
  error: 'A note can be flagged as about "pain" or "illness", or not flagged (null).',
});
export type NoteConcern = z.infer<typeof NoteConcernSchema>;

/** `GET /api/me/unread`: notes the other side wrote that the reader has not opened (api-contract.md). */
export const UnreadAnswerSchema = z.object({
  count: z.number(),
  items: z.array(
    z.object({
      kind: z.enum(['run-note', 'week-note']),
      id: z.string(),
      runner_id: z.string(),
      /** The runner's profile zone (IANA): when the note was written is shown on the runner's clock. */
      runner_time_zone: z.string(),
      created_at: z.string(),
      author_name: z.string(),
      /** The first 140 characters of the note. */
      excerpt: z.string(),
      run_id: z.string().optional(),
      week_start: z.string().optional(),
    }),
  ),
});
export type UnreadAnswer = z.infer<typeof UnreadAnswerSchema>;
