import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { generateLakeRun, type Phase } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

function freshApp() {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-data-'));
  return createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
}

// 8:23 per mile = 503 s/mi = 312.55 s/km (1609.344 m to the mile, REFERENCES.md §1).
const PACE_S_PER_KM = 503 / 1.609344;
const SPEED = 1000 / PACE_S_PER_KM;

describe('GET /api/runs/:id/plan-check with stops', () => {
  it('a 3 h run at an even 8:23/mi with three 60 s stops, planned "20 min easy, 140 min @ MP, 20 min easy": goal-pace part at its moving pace, stops shown apart, nothing cut short', async () => {
    const app = freshApp();
    const { user, password } = await createUser({ role: 'runner' });
    const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
    const auth = { Authorization: `Bearer ${token}` };
    // Goal marathon at the same pace, so "@ MP" resolves to 312.55 s/km (decision 25).
    await db('goal_races').insert({
      user_id: user.id,
      name: 'Goal marathon',
      date: '2027-04-11',
      distance_m: 42195,
      goal_time_s: Math.round(42.195 * PACE_S_PER_KM),
    });
    // Stops at 50, 100 and 150 minutes: all inside the goal-pace part (20–160 min of clock time).
    const phases: Phase[] = [];
    for (const minutes of [50, 49, 49])
      phases.push({ kind: 'run', duration_s: minutes * 60, speed_mps: SPEED }, { kind: 'stop', duration_s: 60 });
    phases.push({ kind: 'run', duration_s: 29 * 60, speed_mps: SPEED });
    const run = generateLakeRun({ start_t: Date.UTC(2026, 9, 4, 7), phases, seed: 21, gps_sigma_m: 1 });
    const upload = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', Buffer.from(writeGpx('Long run', [run.points])), 'long-run.gpx');
    expect(upload.status).toBe(201);
    const runId = upload.body.imported[0].id as string;
    expect(upload.body.imported[0].elapsed_s).toBe(3 * 3600);
    await request(app).post('/api/plans').set(auth).send({ date: '2026-10-04', text: '20 min easy, 140 min @ MP, 20 min easy' });

    const res = await request(app).get(`/api/runs/${runId}/plan-check`).set(auth);
    expect(res.status).toBe(200);
    const parts = res.body.parts as Array<{
      kind: string;
      verdict: string;
      planned: { duration_s: number };
      actual: { duration_s: number; moving_s: number; pace_s_per_km: number; stops: { count: number; seconds: number } };
    }>;
    expect(parts.map((p) => p.kind)).toEqual(['easy', 'goal pace', 'easy']);
    expect(parts.map((p) => p.verdict)).toEqual(['by feel', 'on pace', 'by feel']);
    expect(parts.some((p) => p.verdict === 'cut short')).toBe(false);
    // The goal-pace part: its moving pace, within 0.5 % (8:23/mi ± 2.5 s), not the 8:30 a clock-time pace gives.
    expect(Math.abs(parts[1]!.actual.pace_s_per_km / PACE_S_PER_KM - 1)).toBeLessThan(0.005);
    expect(parts[1]!.actual.stops.count).toBe(3);
    expect(parts[1]!.actual.stops.seconds).toBeGreaterThan(170);
    expect(parts[1]!.actual.stops.seconds).toBeLessThan(200);
    expect(parts[1]!.actual.moving_s).toBeCloseTo(parts[1]!.actual.duration_s - parts[1]!.actual.stops.seconds, -1);
    // The last part is the planned 20 minutes of clock time, so it is not cut short.
    expect(parts[2]!.actual.duration_s).toBeCloseTo(20 * 60, -1);
    expect(res.body.session_verdict).toBe('as planned');
  }, 60_000);
});
