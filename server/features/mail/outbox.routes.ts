import type { AppConfig } from '../../config.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { NotFoundError } from '../../lib/errors.ts';
import { listCaughtMessages } from './outbox.repository.ts';
import { OutboxAnswerSchema } from '../../../shared/api/outbox.ts';

export function createOutboxRouter(config: AppConfig) {
  const api = createApiRouter();
  api.route(
    {
      method: 'get',
      path: '/dev/outbox',
      tag: 'development',
      summary: 'Messages caught by the local mail catcher, newest first (404 in production)',
      access: 'public',
      response: OutboxAnswerSchema,
    },
    async (_req, res) => {
      // Development only: the catcher holds every message the app sends, links and all.
      if (config.env === 'production') throw new NotFoundError('There is nothing at this address.');
      res.json({ messages: await listCaughtMessages() });
    },
  );
  return api;
}
