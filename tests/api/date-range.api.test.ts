import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { DATE_RANGE_MESSAGE } from '../../shared/api/calendar-date.ts';
import { databaseFingerprint } from '../support/db-fingerprint.ts';
import { buildWorld, freshApp, type App, type World } from '../support/test-world.ts';

// Issue 13 #13: week dates 0001-01-01 and 9999-12-31 ended in a 500 (week, week.csv, overview, digest).
// Every date the API takes now lies in 1900-01-01 … 2100-12-31; outside that: 400, the sentence,
// nothing changed. The routes are found in /api/openapi.json, so a new date-taking route without a
// row here fails this file.

interface Row {
  /** Sends the request with `date` wherever the route takes a date. */
  send: (app: App, w: World, date: string) => request.Test | Promise<request.Response>;
  /** The edge of the range this route accepts, when only one fits its tense (a goal race is still to come, a result run). */
  edges?: string[];
}

const ROWS: Record<string, Row> = {
  'GET /api/runs': { send: (app, w, d) => request(app).get('/api/runs').query({ from: d, to: '2026-12-31' }).set(w.runner.auth) },
  'PUT /api/me/goal-race': {
    send: (app, w, d) =>
      request(app)
        .put('/api/me/goal-race')
        .set(w.runner.auth)
        .send({ name: 'Autumn marathon', date: d, distance_m: 42_195, goal_time_s: 3 * 3600 }),
    edges: ['2100-12-31'],
  },
  'POST /api/me/race-results': {
    send: (app, w, d) =>
      request(app)
        .post('/api/me/race-results')
        .set(w.runner.auth)
        .send({ date: d, distance_m: 10_000, time_s: 45 * 60 }),
    edges: ['1900-01-01'],
  },
  'POST /api/plans/copy-week': {
    send: (app, w, d) =>
      request(app).post('/api/plans/copy-week').set(w.runner.auth).send({ from_start: '2026-11-23', to_start: d, mode: 'add' }),
  },
  'POST /api/plans/assign': {
    send: (app, w, d) =>
      request(app)
        .post('/api/plans/assign')
        .set(w.coach.auth)
        .send({ runner_ids: [w.runner.id], date: d, text: '30 min easy' }),
  },
  'GET /api/days': { send: (app, w, d) => request(app).get('/api/days').query({ from: d, to: d }).set(w.runner.auth) },
  'PUT /api/days/{date}': {
    send: (app, w, d) => request(app).put(`/api/days/${d}`).set(w.runner.auth).send({ kind: 'rest' }),
  },
  'DELETE /api/days/{date}': {
    // A mark to remove first (refused too for a date out of range).
    send: async (app, w, d) => {
      await request(app).put(`/api/days/${d}`).set(w.runner.auth).send({ kind: 'rest' });
      return request(app).delete(`/api/days/${d}`).set(w.runner.auth);
    },
  },
  'POST /api/plans': {
    send: (app, w, d) => request(app).post('/api/plans').set(w.runner.auth).send({ date: d, text: '30 min easy' }),
  },
  'GET /api/plans': {
    send: (app, w, d) => request(app).get('/api/plans').query({ from: d, to: '2026-12-31' }).set(w.runner.auth),
  },
  'PATCH /api/plans/{id}': {
    send: (app, w, d) => request(app).patch(`/api/plans/${w.plan}`).set(w.runner.auth).send({ date: d }),
  },
  'GET /api/runners/{id}/week': {
    send: (app, w, d) => request(app).get(`/api/runners/${w.runner.id}/week`).query({ start: d }).set(w.runner.auth),
  },
  'GET /api/runners/{id}/week.csv': {
    send: (app, w, d) => request(app).get(`/api/runners/${w.runner.id}/week.csv`).query({ start: d }).set(w.runner.auth),
  },
  'POST /api/runners/{id}/weeks/{start}/notes': {
    send: (app, w, d) =>
      request(app).post(`/api/runners/${w.runner.id}/weeks/${d}/notes`).set(w.coach.auth).send({ text: 'Good week.' }),
  },
  'PUT /api/runners/{id}/weeks/{start}/review': {
    send: (app, w, d) =>
      request(app).put(`/api/runners/${w.runner.id}/weeks/${d}/review`).set(w.coach.auth).send({ reviewed: true }),
  },
  'GET /api/squads/{id}/overview': {
    send: (app, w, d) => request(app).get(`/api/squads/${w.squad}/overview`).query({ week: d }).set(w.coach.auth),
  },
  'GET /api/squads/{id}/overview.csv': {
    send: (app, w, d) => request(app).get(`/api/squads/${w.squad}/overview.csv`).query({ week: d }).set(w.coach.auth),
  },
  'POST /api/squads/{id}/digest': {
    send: (app, w, d) => request(app).post(`/api/squads/${w.squad}/digest`).set(w.coach.auth).send({ week: d }),
  },
};

/** Routes whose query, path or JSON body takes a date, read from the API description. */
async function dateTakingRoutes(app: App): Promise<string[]> {
  const doc = (await request(app).get('/api/openapi.json')).body as {
    paths: Record<
      string,
      Record<string, { parameters?: Array<{ name: string; schema?: { format?: string } }>; requestBody?: unknown }>
    >;
  };
  const hasDate = (schema: unknown): boolean =>
    !!schema &&
    typeof schema === 'object' &&
    ((schema as { format?: string }).format === 'date' || Object.values(schema).some((v) => hasDate(v)));
  const routes: string[] = [];
  for (const [route, operations] of Object.entries(doc.paths))
    for (const [method, op] of Object.entries(operations)) {
      // Path values parsed by the handler (`:date`, `:start`) are named for what they hold.
      const pathDate = /\{(date|start)\}/.test(route);
      if (pathDate || (op.parameters ?? []).some((p) => p.schema?.format === 'date') || hasDate(op.requestBody))
        routes.push(`${method.toUpperCase()} ${route}`);
    }
  return routes.sort();
}

// Year 1 and 9999 are the dates of the finding; 1899-12-31 and 2101-01-01 are the first days out.
const OUT_OF_RANGE = ['0001-01-01', '9999-12-31', '1899-12-31', '2101-01-01'];

describe('dates outside 1900–2100 (issue 13 #13)', () => {
  it('every date-taking route has a row here (found in /api/openapi.json)', async () => {
    const found = await dateTakingRoutes(freshApp('dates'));
    expect(found).toEqual(Object.keys(ROWS).sort());
    expect(found.length).toBeGreaterThanOrEqual(18);
  });

  it.each(Object.keys(ROWS))(
    '%s: 400 with the sentence for years 1, 9999, 1899 and 2101, nothing changed; 1900-01-01 and 2100-12-31 pass',
    async (key) => {
      const app = freshApp('dates');
      const world = await buildWorld(app);
      const before = await databaseFingerprint();
      for (const date of OUT_OF_RANGE) {
        const res = await ROWS[key]!.send(app, world, date);
        expect([date, res.status]).toEqual([date, 400]);
        // One sentence, given for every date field that is out (GET /api/days has two).
        const sentences = new Set([
          res.body.error,
          ...((res.body.details ?? []) as Array<{ message: string }>).map((d) => d.message),
        ]);
        sentences.delete('Some fields need attention.');
        expect([...sentences]).toEqual([DATE_RANGE_MESSAGE]);
      }
      expect(await databaseFingerprint()).toEqual(before);
      // The edges of the range are accepted: it is the date that was refused, nothing else.
      for (const date of ROWS[key]!.edges ?? ['1900-01-01', '2100-12-31']) {
        const res = await ROWS[key]!.send(app, world, date);
        expect([date, res.status]).toEqual([date, expect.toSatisfy((s: number) => s >= 200 && s < 300)]);
      }
    },
  );
});
