import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { afterAnswerSettled } from '../../server/lib/after-answer.ts';
import { db } from '../../server/lib/db.ts';
import { CONTROL_CHARACTER_MESSAGE } from '../../shared/api/text.ts';
import { databaseFingerprint } from '../support/db-fingerprint.ts';
import { buildWorld, freshApp, type App, type World } from '../support/test-world.ts';

// Issue 13 #13: a NUL byte in any text field ended in a 500 (PostgreSQL cannot store it in text).
// Every validated field now refuses control characters (C0 but tab, line feed and carriage return;
// DEL; C1) with one sentence: 400, nothing changed. Tabs and line breaks in notes still pass.

interface Case {
  /** The field the sentence is given for. */
  field: string;
  send: (app: App, w: World, text: string) => request.Test;
}

const CASES: Record<string, Case> = {
  'sign-up name (public)': {
    field: 'name',
    send: (app, _w, text) =>
      request(app)
        .post('/api/auth/register')
        .send({ email: 'new@example.test', password: 'a long enough secret', name: text, role: 'runner' }),
  },
  'profile name': {
    field: 'name',
    send: (app, w, text) => request(app).patch('/api/me').set(w.runner.auth).send({ name: text }),
  },
  'session title': {
    field: 'title',
    send: (app, w, text) =>
      request(app).post('/api/plans').set(w.runner.auth).send({ date: '2026-11-25', title: text, text: '30 min easy' }),
  },
  'session shorthand': {
    field: 'text',
    send: (app, w, text) =>
      request(app)
        .patch(`/api/plans/${w.plan}`)
        .set(w.runner.auth)
        .send({ text: `${text} 40 min easy` }),
  },
  'squad name': {
    field: 'name',
    send: (app, w, text) => request(app).post('/api/squads').set(w.coach.auth).send({ name: text }),
  },
  'week note': {
    field: 'text',
    send: (app, w, text) =>
      request(app).post(`/api/runners/${w.runner.id}/weeks/2026-11-23/notes`).set(w.coach.auth).send({ text }),
  },
  'goal race name': {
    field: 'name',
    send: (app, w, text) =>
      request(app)
        .put('/api/me/goal-race')
        .set(w.runner.auth)
        .send({ name: text, date: '2027-04-18', distance_m: 42_195, goal_time_s: 3 * 3600 }),
  },
  'library session name': {
    field: 'name',
    send: (app, w, text) => request(app).post('/api/library').set(w.coach.auth).send({ name: text, text: '6 x 800 m' }),
  },
  'token name': {
    field: 'name',
    send: (app, w, text) => request(app).post('/api/auth/tokens').set(w.runner.auth).send({ name: text }),
  },
  'a query value': {
    field: 'sort',
    send: (app, w, text) => request(app).get('/api/runs').query({ sort: text }).set(w.runner.auth),
  },
};

// NUL (the finding), a C0 control, escape, DEL and a C1 control.
const CONTROLS = ['\u0000', '\u0007', '\u001b', '\u007f', '\u0085'];

describe('control characters in text (issue 13 #13)', () => {
  it.each(Object.keys(CASES))('%s: 400 with one sentence for NUL, BEL, ESC, DEL and NEL; nothing changed', async (name) => {
    const app = freshApp('controls');
    const world = await buildWorld(app);
    const { field, send } = CASES[name]!;
    await afterAnswerSettled();
    const before = await databaseFingerprint();
    for (const control of CONTROLS) {
      const res = await send(app, world, `Easy${control}day`);
      expect([JSON.stringify(control), res.status]).toEqual([JSON.stringify(control), 400]);
      expect(res.body.error).toBe(CONTROL_CHARACTER_MESSAGE);
      expect(res.body.details).toEqual([{ field, message: CONTROL_CHARACTER_MESSAGE }]);
    }
    await afterAnswerSettled();
    expect(await databaseFingerprint()).toEqual(before);
  });

  it('a nested field and an object key are named too; tabs and line breaks in a note are kept', async () => {
    const app = freshApp('controls');
    const world = await buildWorld(app);
    const nested = await request(app)
      .post('/api/plans')
      .set(world.runner.auth)
      .send({ date: '2026-11-26', parts: [{ type: 'easy', amount: { type: 'duration', duration_s: 600 }, notes: 'a\u0000b' }] });
    expect(nested.status).toBe(400);
    expect(nested.body.details).toEqual([{ field: 'parts.0.notes', message: CONTROL_CHARACTER_MESSAGE }]);
    const key = await request(app).patch('/api/me').set(world.runner.auth).send({ 'na\u0000me': 'x' });
    expect(key.status).toBe(400);
    expect(key.body.details).toEqual([{ field: 'na?me', message: CONTROL_CHARACTER_MESSAGE }]);

    const lines = 'Strong week.\r\nKeep Tuesday easy:\tno watch.';
    const note = await request(app)
      .post(`/api/runners/${world.runner.id}/weeks/2026-11-23/notes`)
      .set(world.coach.auth)
      .send({ text: lines });
    expect(note.status).toBe(201);
    expect(await db('week_notes').pluck('text')).toEqual([lines]);
  });

  it('a password may hold any character: it is only ever stored as a hash', async () => {
    const app = freshApp('controls');
    const res = await request(app)
      .post('/api/auth/register')
      .send({ email: 'odd@example.test', password: 'long enough \u0007 secret', name: 'Odd Password', role: 'runner' });
    expect(res.status).toBe(201);
    await afterAnswerSettled();
  });
});
