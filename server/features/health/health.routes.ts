import { HealthSchema } from '../../../shared/api/health.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { isDatabaseUp } from '../../lib/db.ts';

export function createHealthRouter() {
  const api = createApiRouter();
  api.route(
    {
      method: 'get',
      path: '/health',
      tag: 'service',
      summary: 'Is the service and its database up? 200 when yes, 503 when the database is down',
      access: 'public',
      response: HealthSchema,
    },
    async (_req, res) => {
      const up = await isDatabaseUp();
      res.status(up ? 200 : 503).json({ ok: up, db: up ? 'up' : 'down' });
    },
  );
  return api;
}
