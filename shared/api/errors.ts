import { z } from 'zod';

/** The error body of every failed request (api-contract.md): `error` is a sentence for people, `code` is for programs. */
export const ApiErrorBodySchema = z.object({
  error: z.string(),
  code: z.string(),
  details: z.unknown().optional(),
});
export type ApiErrorBody = z.infer<typeof ApiErrorBodySchema>;

/** Field problems carried in `details` of a 400. */
export const FieldIssueSchema = z.object({ field: z.string(), message: z.string() });
export type FieldIssue = z.infer<typeof FieldIssueSchema>;
