import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { PlanCheckAnswerSchema, PlanCheckPartSchema } from '../../shared/plans/plan-check-answer.ts';
import { generateLakeRun, type Phase } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

function freshApp() {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-data-'));
  return createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
}

// Reps at 3:40/km = 220 s/km.
const REP_SPEED = 1000 / 220;

describe('GET /api/runs/:id/plan-check answer', () => {
  it('"10 min easy, 6 x 3 min @ 3:40/km w/ 90 s jog", stopped after rep 6: the answer is the shared schema, no recovery after the last rep, the reps on one line', async () => {
    const app = freshApp();
    const { user, password } = await createUser({ role: 'runner' });
    const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
    const auth = { Authorization: `Bearer ${token}` };
    const phases: Phase[] = [{ kind: 'run', duration_s: 600, speed_mps: 2.8 }];
    for (let i = 0; i < 6; i++) {
      phases.push({ kind: 'run', duration_s: 180, speed_mps: REP_SPEED });
      if (i < 5) phases.push({ kind: 'run', duration_s: 90, speed_mps: 2.2 });
    }
    const run = generateLakeRun({ start_t: Date.UTC(2026, 9, 6, 7), phases, seed: 5, gps_sigma_m: 0 });
    const upload = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', Buffer.from(writeGpx('Reps', [run.points])), 'reps.gpx');
    expect(upload.status).toBe(201);
    const runId = upload.body.imported[0].id as string;
    const plan = await request(app)
      .post('/api/plans')
      .set(auth)
      .send({ date: '2026-10-06', text: '10 min easy, 6 x 3 min @ 3:40/km w/ 90 s jog' });
    expect(plan.status).toBe(201);

    const res = await request(app).get(`/api/runs/${runId}/plan-check`).set(auth);
    expect(res.status).toBe(200);
    // Exactly the declared shape: every key known to the schema, nothing extra.
    expect(PlanCheckAnswerSchema.strict().safeParse(res.body).error).toBeUndefined();
    for (const part of res.body.parts) expect(PlanCheckPartSchema.strict().safeParse(part).success).toBe(true);
    const kinds = (res.body.parts as Array<{ kind: string }>).map((p) => p.kind);
    // 1 easy part, 6 reps, 5 recoveries between them: the plan did not write one after rep 6.
    expect(kinds).toHaveLength(12);
    expect(kinds.at(-1)).toBe('rep');
    expect(kinds.filter((k) => k === 'recovery jog')).toHaveLength(5);
    expect(res.body.session_verdict).toBe('as planned');
    expect(res.body.rep_blocks).toHaveLength(1);
    const block = res.body.rep_blocks[0];
    expect(block).toMatchObject({
      item_index: 1,
      step: 0,
      kind: 'rep',
      reps: 6,
      run: 6,
      on_pace: 6,
      amount: { duration_s: 180 },
    });
    // Even reps on a clean track: each within 1 s/km of 220, first to last within 1 s/km.
    expect(block.paces_s_per_km).toHaveLength(6);
    for (const pace of block.paces_s_per_km) expect(Math.abs(pace - 220)).toBeLessThan(1);
    expect(Math.abs(block.first_to_last_s_per_km)).toBeLessThan(1);

    // The route documents the same schema in /api/openapi.json.
    const openapi = await request(app).get('/api/openapi.json');
    const op = openapi.body.paths?.['/api/runs/{id}/plan-check']?.get;
    expect(JSON.stringify(op?.responses ?? {})).toContain('rep_blocks');
  }, 60_000);
});
