import { z } from 'zod';

export const ImportStatusSchema = z.enum(['queued', 'running', 'done', 'failed']);
export type ImportStatus = z.infer<typeof ImportStatusSchema>;

export const ImportRejectionSchema = z.object({ file: z.string(), error: z.string() });

/** Progress of a bulk import (GET /api/imports/:id): `done` counts files finished either way, out of `total`. */
export const ImportProgressSchema = z.object({
  id: z.string(),
  status: ImportStatusSchema,
  total: z.number(),
  done: z.number(),
  imported: z.number(),
  duplicates: z.number(),
  rejected: z.array(ImportRejectionSchema),
});
export type ImportProgress = z.infer<typeof ImportProgressSchema>;

export const ImportCreatedSchema = z.object({ import: z.object({ id: z.string() }) });
export type ImportCreated = z.infer<typeof ImportCreatedSchema>;

export const DeleteAccountInputSchema = z.object({
  password: z.string({ error: 'Type your password to confirm.' }).min(1, { error: 'Type your password to confirm.' }),
});
export type DeleteAccountInput = z.infer<typeof DeleteAccountInputSchema>;
