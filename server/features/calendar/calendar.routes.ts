import { readTokenParam } from '../../lib/ids.ts';
import { ICALENDAR } from '../../../shared/api/media-types.ts';
import { CalendarFeedSchema, CalendarFeedStatusSchema } from '../../../shared/plans/prescribe-schemas.ts';
import type { AppConfig } from '../../config.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { requireActor } from '../../lib/authorize.ts';
import { calendarFeedStatus, createCalendarFeed, removeCalendarFeed, renderCalendarFeed } from './calendar.service.ts';

/** Issue 15: a private iCalendar (RFC 5545) subscription of one's planned sessions. */
export function createCalendarRouter(config: AppConfig) {
  const api = createApiRouter();

  api.route(
    {
      method: 'get',
      path: '/me/calendar',
      tag: 'calendar',
      summary: 'Whether the calendar feed is on and since when (the address is shown only when made)',
      access: 'own-data',
      response: CalendarFeedStatusSchema,
    },
    async (_req, res) => {
      res.json(await calendarFeedStatus(requireActor(res)));
    },
  );

  api.route(
    {
      method: 'post',
      path: '/me/calendar',
      tag: 'calendar',
      summary: 'A new secret calendar feed address (shown once); any earlier one stops working',
      access: 'own-data',
      response: CalendarFeedSchema,
      status: 201,
    },
    async (_req, res) => {
      res.status(201).json({ url: await createCalendarFeed(requireActor(res), config.publicUrl) });
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/me/calendar',
      tag: 'calendar',
      summary: 'Turn the calendar feed off',
      access: 'own-data',
      status: 204,
    },
    async (_req, res) => {
      await removeCalendarFeed(requireActor(res));
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'get',
      path: '/calendar/:token',
      file: [ICALENDAR],
      tag: 'calendar',
      summary: 'The calendar feed (text/calendar, no sign-in: the address is the secret); revoked or made up → 404',
      access: 'public',
      params: { token: readTokenParam },
    },
    async (req, res) => {
      const body = await renderCalendarFeed(req.params.token, config.publicUrl);
      res.type('text/calendar; charset=utf-8').set('Cache-Control', 'private, no-store').send(body);
    },
  );

  return api;
}
