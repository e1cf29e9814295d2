import { UnreadAnswerSchema } from '../../../shared/notes/schemas.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { requireActor } from '../../lib/authorize.ts';
import { parseIdParam } from '../../lib/ids.ts';
import { markNoteRead, unreadOf } from './notes.service.ts';

export function createNotesRouter() {
  const api = createApiRouter();

  api.route(
    {
      method: 'get',
      path: '/me/unread',
      tag: 'notes',
      summary: 'Notes the other side wrote that you have not opened: a count and the newest 100',
      access: 'own-data',
      response: UnreadAnswerSchema,
    },
    async (_req, res) => {
      res.json(await unreadOf(requireActor(res)));
    },
  );

  api.route(
    {
      method: 'post',
      path: '/notes/:id/read',
      tag: 'notes',
      summary: 'Mark a note (on a run or a week) you may read as opened',
      access: 'own-data',
      params: { id: parseIdParam },
      status: 204,
    },
    async (req, res) => {
      await markNoteRead(requireActor(res), req.params.id);
      res.status(204).end();
    },
  );

  return api;
}
