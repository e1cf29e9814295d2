import { z } from 'zod';

/** `GET /api/health`: 200 when the service and its database are up, 503 (same body) when the database is down. */
export const HealthSchema = z.object({ ok: z.boolean(), db: z.enum(['up', 'down']) });
export type Health = z.infer<typeof HealthSchema>;
