import { readFileSync } from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import * as canonicalTimeZones from '../../db/migrations/20261205124000_canonical_time_zones.ts';
import { db } from '../../server/lib/db.ts';
import { freshApp, person } from '../support/test-world.ts';

async function zoneOf(table: 'users' | 'runs', id: string): Promise<string | undefined> {
  const row = (await db(table).where({ id }).first('time_zone')) as { time_zone: string } | undefined;
  return row?.time_zone;
}

// IANA tz database, file `backward`: "Link Asia/Kolkata Asia/Calcutta" and "Link Europe/Kyiv Europe/Kiev":
// the old names are aliases of the current ones.

describe('the profile time zone: current IANA names, old ones accepted as aliases', () => {
  it('an older client sending Asia/Calcutta gets Asia/Kolkata stored and answered', async () => {
    const app = freshApp('tz-alias');
    const runner = await person(app, 'runner', 'Tz Runner');

    const saved = await request(app).patch('/api/me').set(runner.auth).send({ time_zone: 'Asia/Calcutta' });
    expect(saved.status).toBe(200);
    expect(saved.body.profile.time_zone).toBe('Asia/Kolkata');
    expect(await zoneOf('users', runner.id)).toBe('Asia/Kolkata');
    expect((await request(app).get('/api/me').set(runner.auth)).body.profile.time_zone).toBe('Asia/Kolkata');

    const current = await request(app).patch('/api/me').set(runner.auth).send({ time_zone: 'Europe/Kyiv' });
    expect(current.status).toBe(200);
    expect(current.body.profile.time_zone).toBe('Europe/Kyiv');
  });

  it('a name that is no time zone is refused in words and changes nothing', async () => {
    const app = freshApp('tz-refused');
    const runner = await person(app, 'runner', 'Tz Refused');
    await request(app).patch('/api/me').set(runner.auth).send({ time_zone: 'Europe/Berlin' }).expect(200);

    const refused = await request(app).patch('/api/me').set(runner.auth).send({ time_zone: 'Mars/Olympus_Mons' });
    expect(refused.status).toBe(400);
    expect(JSON.stringify(refused.body)).toContain('Choose a time zone from the list');
    expect(await zoneOf('users', runner.id)).toBe('Europe/Berlin');
  });

  it('the migration renames old names already stored in users and runs, and leaves current ones alone', async () => {
    const app = freshApp('tz-migration');
    const kiev = await person(app, 'runner', 'Tz Stored Old');
    const berlin = await person(app, 'runner', 'Tz Stored Current');
    const upload = await request(app)
      .post('/api/runs')
      .set(kiev.auth)
      .attach('files', readFileSync(path.resolve('fixtures/gps-samples/run-hr-4s.gpx')), 'run-hr-4s.gpx');
    expect(upload.status).toBe(201);
    const runId = upload.body.imported[0].id as string;
    // As a browser's Intl list or an older release stored them before issue 17.
    await db('users').where({ id: kiev.id }).update({ time_zone: 'Europe/Kiev' });
    await db('users').where({ id: berlin.id }).update({ time_zone: 'Europe/Berlin' });
    await db('runs').where({ id: runId }).update({ time_zone: 'Asia/Calcutta' });

    await canonicalTimeZones.up(db);

    expect(await zoneOf('users', kiev.id)).toBe('Europe/Kyiv');
    expect(await zoneOf('users', berlin.id)).toBe('Europe/Berlin');
    expect(await zoneOf('runs', runId)).toBe('Asia/Kolkata');
    expect((await request(app).get('/api/me').set(kiev.auth)).body.profile.time_zone).toBe('Europe/Kyiv');
  });
});
