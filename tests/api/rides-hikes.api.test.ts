import { readFileSync } from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { freshApp, person } from '../support/test-world.ts';

const sample = (name: string) => readFileSync(path.join('fixtures/gps-samples', name));

/** A generated 40 min activity at `speed` m/s on `date` 07:00 UTC, its GPX `<type>` set to `type`. */
function gpx(date: string, speed: number, type: string): Buffer {
  const run = generateLakeRun({
    start_t: Date.parse(`${date}T07:00:00Z`),
    phases: [{ kind: 'run', duration_s: 2400, speed_mps: speed }],
    seed: 11,
  });
  return Buffer.from(writeGpx('Morning', [run.points]).replace('<type>running</type>', `<type>${type}</type>`));
}

describe('rides and hikes (issue #14)', () => {
  it('the file’s sport and speeds make a ride or a hike; they stay out of the week’s running totals and the plan check until the runner makes them a run', async () => {
    const app = freshApp('rides');
    const { id: userId, auth } = await person(app, 'runner', 'Test Runner');
    // Real files: TCX Sport="Biking"; a 10 h walk-pace GPX without a type.
    const ride = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', sample('ride-excerpt-distance-offset.tcx'), 'r.tcx');
    expect(ride.status).toBe(201);
    expect(ride.body.imported[0].kind).toBe('ride');
    const hike = await request(app).post('/api/runs').set(auth).attach('files', sample('handheld-10h-extensions.gpx'), 'h.gpx');
    expect(hike.body.imported[0].kind).toBe('hike');

    // One week: a 7.2 km run on Tuesday and a 7.2 km "cycling" file on Thursday, both planned.
    const run = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', gpx('2026-11-24', 3, 'running'), 'run.gpx');
    const cycle = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', gpx('2026-11-26', 3, 'cycling'), 'cycle.gpx');
    expect(run.body.imported[0].kind).toBe('run');
    expect(cycle.body.imported[0].kind).toBe('ride');
    const cycleId = cycle.body.imported[0].id as string;
    await request(app).post('/api/plans').set(auth).send({ date: '2026-11-26', text: '7 km easy' });

    const week = async () => (await request(app).get(`/api/runners/${userId}/week?start=2026-11-23`).set(auth)).body;
    const before = await week();
    expect(before.totals.run_distance_m / 1000).toBeCloseTo(7.2, 1);
    expect(before.days[3].runs).toEqual([]);
    const check = await request(app).get(`/api/runs/${cycleId}/plan-check`).set(auth);
    expect(check.body).toMatchObject({ session_verdict: 'unplanned', parts: [] });
    // The run page says what it is.
    expect((await request(app).get(`/api/runs/${cycleId}`).set(auth)).body.kind).toBe('ride');

    // A wrong kind is refused and changes nothing.
    const bad = await request(app).patch(`/api/runs/${cycleId}`).set(auth).send({ kind: 'swim' });
    expect(bad.status).toBe(400);
    expect(bad.body.error).toMatch(/run', 'ride' or 'hike'/);
    expect((await request(app).get(`/api/runs/${cycleId}`).set(auth)).body.kind).toBe('ride');
    // Another runner cannot change it.
    const other = await person(app, 'runner', 'Other Runner');
    expect((await request(app).patch(`/api/runs/${cycleId}`).set(other.auth).send({ kind: 'run' })).status).toBe(404);

    // The runner says it was a run: it counts, and it is checked against Thursday's plan.
    const changed = await request(app).patch(`/api/runs/${cycleId}`).set(auth).send({ kind: 'run' });
    expect(changed.status).toBe(200);
    expect(changed.body.run).toMatchObject({ id: cycleId, kind: 'run', name: 'Morning' });
    const after = await week();
    expect(after.totals.run_distance_m / 1000).toBeCloseTo(14.4, 1);
    expect(after.days[3].runs).toHaveLength(1);
    const checked = await request(app).get(`/api/runs/${cycleId}/plan-check`).set(auth);
    expect(checked.body.parts.map((p: { kind: string }) => p.kind)).toEqual(['easy']);

    // The runs list carries the kind for its mark.
    const list = (await request(app).get('/api/runs?per_page=10').set(auth)).body.runs as Array<{ kind: string }>;
    expect(list.map((r) => r.kind).sort()).toEqual(['hike', 'ride', 'run', 'run']);
  }, 60_000);
});
