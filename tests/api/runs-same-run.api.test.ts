import { readFileSync } from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { db } from '../../server/lib/db.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { freshApp, person } from '../support/test-world.ts';

const sample = (name: string) => readFileSync(path.join('fixtures/gps-samples', name));

async function counts(userId: string) {
  const [runs] = await db('runs').where({ user_id: userId }).count({ n: '*' });
  const [files] = await db('source_files').where({ user_id: userId }).count({ n: '*' });
  return { runs: Number(runs!.n), files: Number(files!.n) };
}

describe('the same run in two files (issue #14)', () => {
  it('a single-activity TCX, then the two-activity TCX that holds it: activity 1 is a duplicate of the stored run, activity 2 is imported; "import anyway" brings activity 1 in', async () => {
    const app = freshApp('same-run');
    const { id: userId, auth } = await person(app, 'runner', 'Test Runner');
    // SOURCES.tsv: two-activities.tcx holds watch-run-15-laps.tcx as its first activity (other bytes).
    const single = await request(app).post('/api/runs').set(auth).attach('files', sample('watch-run-15-laps.tcx'), 'single.tcx');
    expect(single.status).toBe(201);
    const storedId = single.body.imported[0].id as string;

    const both = await request(app).post('/api/runs').set(auth).attach('files', sample('two-activities.tcx'), 'both.tcx');
    expect(both.status).toBe(201);
    expect(both.body.duplicates).toEqual([{ file: 'both.tcx', runId: storedId, reason: 'same run', activity: 1 }]);
    expect(both.body.imported).toHaveLength(1);
    // Activity 2: 19 149.4 m by the device (REFERENCE.tsv), not the 14 332.3 m of activity 1.
    expect(both.body.imported[0].distance_m).toBeCloseTo(19149.4, 0);
    expect(await counts(userId)).toEqual({ runs: 2, files: 2 });

    // The runner says import it anyway: only the missing activity of the stored file comes in.
    const anyway = await request(app)
      .post('/api/runs?duplicates=import')
      .set(auth)
      .attach('files', sample('two-activities.tcx'), 'both.tcx');
    expect(anyway.status).toBe(201);
    expect(anyway.body.imported).toHaveLength(1);
    expect(anyway.body.imported[0].distance_m).toBeCloseTo(14332.3, 0);
    expect(anyway.body.duplicates).toEqual([]);
    expect(await counts(userId)).toEqual({ runs: 3, files: 2 });

    // The very same bytes once more, even "anyway": nothing left to import, said as the same file.
    const again = await request(app)
      .post('/api/runs?duplicates=import')
      .set(auth)
      .attach('files', sample('two-activities.tcx'), 'both.tcx');
    expect(again.status).toBe(422);
    expect(again.body.duplicates).toHaveLength(1);
    expect(again.body.duplicates[0]).toMatchObject({ file: 'both.tcx', reason: 'same file', activity: null });
    expect(await counts(userId)).toEqual({ runs: 3, files: 2 });

    const bad = await request(app).post('/api/runs?duplicates=maybe').set(auth).attach('files', sample('run-hr-4s.gpx'), 'x.gpx');
    expect(bad.status).toBe(400);
    expect(await counts(userId)).toEqual({ runs: 3, files: 2 });
  }, 60_000);

  it('start within 5 s and distance within 2 % is the same run whatever the bytes; 6 s apart or 3 % longer is not', async () => {
    const app = freshApp('same-run');
    const { id: userId, auth } = await person(app, 'runner', 'Test Runner');
    const start = Date.UTC(2026, 10, 2, 6, 30);
    const gpx = (name: string, shiftS: number, speed: number) =>
      Buffer.from(
        writeGpx(name, [
          generateLakeRun({
            start_t: start + shiftS * 1000,
            phases: [{ kind: 'run', duration_s: 1200, speed_mps: speed }],
            seed: 3,
          }).points,
        ]),
      );
    const first = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', gpx('Morning', 0, 3), 'a.gpx');
    expect(first.status).toBe(201);
    const id = first.body.imported[0].id as string;
    // Another name (other bytes), 4 s later, 1 % longer: the same run.
    const same = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', gpx('Morning run', 4, 3.03), 'b.gpx');
    expect(same.status).toBe(422);
    expect(same.body.duplicates).toEqual([{ file: 'b.gpx', runId: id, reason: 'same run', activity: null }]);
    expect(await counts(userId)).toEqual({ runs: 1, files: 1 });
    // 6 s later: another run.
    const later = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', gpx('Later', 6, 3), 'c.gpx');
    expect(later.status).toBe(201);
    // 3 % longer, same start: another run.
    const longer = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', gpx('Longer', 0, 3.09), 'd.gpx');
    expect(longer.status).toBe(201);
    expect(await counts(userId)).toEqual({ runs: 3, files: 3 });
  }, 60_000);
});

describe('the same run in two files uploaded at the same instant (issue #14)', () => {
  it('two different files of one run sent at once: one run is stored and the other upload is answered "same run"', async () => {
    const app = freshApp('same-run');
    const { id: userId, auth } = await person(app, 'runner', 'Test Runner');
    const start = Date.UTC(2026, 10, 3, 6, 30);
    // One run written twice with other bytes: another name, 2 s later, 1 % longer (the same run by
    // SAME_RUN_START_S and SAME_RUN_DISTANCE_SHARE), both 1 s files so each is parsed in its own worker.
    const gpx = (name: string, shiftS: number, speed: number) =>
      Buffer.from(
        writeGpx(name, [
          generateLakeRun({
            start_t: start + shiftS * 1000,
            phases: [{ kind: 'run', duration_s: 1800, speed_mps: speed }],
            seed: 5,
          }).points,
        ]),
      );
    // Make "the same instant" certain: this transaction holds the runner's row, so storing either
    // upload (its rows reference the runner) waits until it ends. Both uploads are let through once
    // both are waiting on it, directly or behind the other: without a lock around the same-run check,
    // each would have checked before the other stored anything, and both would be stored.
    const holder = await db.transaction();
    await holder('users').where({ id: userId }).forUpdate().select('id');
    const holderPid = (await holder.raw('select pg_backend_pid() as pid')).rows[0].pid as number;
    const uploads = Promise.all([
      request(app)
        .post('/api/runs')
        .set(auth)
        .attach('files', gpx('Morning', 0, 3), 'a.gpx'),
      request(app)
        .post('/api/runs')
        .set(auth)
        .attach('files', gpx('Morning run', 2, 3.03), 'b.gpx'),
    ]);
    const waitingBehindHolder = async () => {
      const { rows } = await db.raw(
        `select count(*)::int as n from pg_stat_activity w
          where w.wait_event_type = 'Lock'
            and (? = any(pg_blocking_pids(w.pid))
                 or exists (select 1 from pg_stat_activity x
                             where ? = any(pg_blocking_pids(x.pid)) and x.pid = any(pg_blocking_pids(w.pid))))`,
        [holderPid, holderPid],
      );
      return rows[0].n as number;
    };
    await expect.poll(waitingBehindHolder, { timeout: 45_000, interval: 50 }).toBe(2);
    await holder.commit();
    const [a, b] = await uploads;
    expect([a.status, b.status].sort()).toEqual([201, 422]);
    const [stored, refused] = a.status === 201 ? [a, b] : [b, a];
    expect(stored.body.imported).toHaveLength(1);
    expect(refused.body.imported).toEqual([]);
    expect(refused.body.duplicates).toEqual([
      { file: refused === a ? 'a.gpx' : 'b.gpx', runId: stored.body.imported[0].id, reason: 'same run', activity: null },
    ]);
    expect(await counts(userId)).toEqual({ runs: 1, files: 1 });
  }, 90_000);
});

describe('times that go backwards (issue #14)', () => {
  it('a TCX whose track, once its backwards point is left out, is 1 s beside 13.68 km of laps is refused with a sentence; nothing is stored', async () => {
    const app = freshApp('same-run');
    const { id: userId, auth } = await person(app, 'runner', 'Test Runner');
    const res = await request(app).post('/api/runs').set(auth).attach('files', sample('odd-backwards-time.tcx'), 'odd.tcx');
    expect(res.status).toBe(422);
    expect(res.body.imported).toEqual([]);
    // REFERENCE.tsv: 1 backwards time step; two laps of 6 839.97 m and 2 283 s each; device delta 2.7 m.
    expect(res.body.rejected).toEqual([
      {
        file: 'odd.tcx',
        error:
          'Times in this file go backwards: 1 point earlier than the one before was left out, and the track left covers only 0:01 and 3 m, while its device laps record 1:16:06 and 13.68 km (8.50 mi). Nothing was imported: export the activity from the device again.',
      },
    ]);
    expect(await counts(userId)).toEqual({ runs: 0, files: 0 });
  }, 60_000);
});
