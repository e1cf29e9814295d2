import { readFileSync } from 'node:fs';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { startPaymentFake } from '../../server/features/fees/payment-fake.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { createUser } from '../support/factories.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

/**
 * Every route that touches a runner's data × every kind of caller → the expected status, in one table.
 * "Who may read this" lives in shared/auth/permissions.ts; this proves every route asks it.
 */
const ACTORS = ['owner', 'other runner', 'coach', 'other coach', 'admin', 'signed out'] as const;
type ActorName = (typeof ACTORS)[number];

interface World {
  app: ReturnType<typeof createApp>;
  auth: Record<ActorName, Record<string, string>>;
  ownerId: string;
  runId: string;
  planId: string;
  squadId: string;
  week: string;
}

// Checkouts go to the local fake of the payment service (issue 20).
const paymentFake = await startPaymentFake({ webhookSecret: 'whsec_matrix' });
afterAll(() => paymentFake.close());

async function buildWorld(): Promise<World> {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-matrix-'));
  const config = testConfig({ dataDir });
  config.payments = { ...config.payments, url: paymentFake.url, webhookSecret: 'whsec_matrix' };
  const app = createApp({ config, store: createFsStore(dataDir), mailer: recordingMailer });
  const people = {
    owner: await createUser({ role: 'runner' }),
    'other runner': await createUser({ role: 'runner' }),
    coach: await createUser({ role: 'coach' }),
    'other coach': await createUser({ role: 'coach' }),
    admin: await createUser({ role: 'admin' }),
  };
  const [squad] = await db('squads').insert({ coach_id: people.coach.user.id, name: 'Squad' }).returning('id');
  const [otherSquad] = await db('squads')
    .insert({ coach_id: people['other coach'].user.id, name: 'Other squad' })
    .returning('id');
  await db('squad_members').insert([
    { squad_id: squad!.id, runner_id: people.owner.user.id },
    { squad_id: otherSquad!.id, runner_id: people['other runner'].user.id },
  ]);
  await db('squad_fees').insert({ squad_id: squad!.id, kind: 'monthly', amount_minor: 4500, currency: 'USD' });
  const auth = { 'signed out': {} } as Record<ActorName, Record<string, string>>;
  for (const [name, p] of Object.entries(people)) {
    const token = (await request(app).post('/api/auth/token').send({ email: p.user.email, password: p.password })).body
      .token as string;
    auth[name as ActorName] = { Authorization: `Bearer ${token}` };
  }
  const run = await request(app)
    .post('/api/runs')
    .set(auth.owner)
    .attach('files', readFileSync('fixtures/gps-samples/run-hr-4s.gpx'), 'run.gpx');
  const runId = run.body.imported[0].id as string;
  const plan = await request(app).post('/api/plans').set(auth.owner).send({ date: '2012-10-24', text: '45 min easy' });
  return { app, auth, ownerId: people.owner.user.id, runId, planId: plan.body.plan.id, squadId: squad!.id, week: '2012-10-22' };
}

interface Case {
  name: string;
  call: (w: World, auth: Record<string, string>) => request.Test;
  expected: Record<ActorName, number>;
  /** Changes or removes the resource: each caller gets a world of their own. */
  destructive?: boolean;
}

const s = (
  owner: number,
  otherRunner: number,
  coach: number,
  otherCoach: number,
  admin: number,
  signedOut: number,
): Record<ActorName, number> => ({
  owner,
  'other runner': otherRunner,
  coach,
  'other coach': otherCoach,
  admin,
  'signed out': signedOut,
});

const CASES: Case[] = [
  {
    name: 'GET /api/runs/:id',
    call: (w, a) => request(w.app).get(`/api/runs/${w.runId}`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'GET /api/runs/:id/splits.csv',
    call: (w, a) => request(w.app).get(`/api/runs/${w.runId}/splits.csv`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'GET /api/runs/:id/track',
    call: (w, a) => request(w.app).get(`/api/runs/${w.runId}/track`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'GET /api/runs/:id/original',
    call: (w, a) => request(w.app).get(`/api/runs/${w.runId}/original`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'GET /api/runs/:id/plan-check',
    call: (w, a) => request(w.app).get(`/api/runs/${w.runId}/plan-check`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'GET /api/runs/:id/notes',
    call: (w, a) => request(w.app).get(`/api/runs/${w.runId}/notes`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'POST /api/runs/:id/notes',
    call: (w, a) => request(w.app).post(`/api/runs/${w.runId}/notes`).set(a).send({ text: 'Note.' }),
    expected: s(201, 404, 201, 404, 201, 401),
  },
  {
    name: 'PATCH /api/runs/:id',
    call: (w, a) => request(w.app).patch(`/api/runs/${w.runId}`).set(a).send({ name: 'Renamed' }),
    expected: s(200, 404, 404, 404, 404, 401),
    destructive: true,
  },
  {
    name: 'DELETE /api/runs/:id',
    call: (w, a) => request(w.app).delete(`/api/runs/${w.runId}`).set(a),
    expected: s(204, 404, 404, 404, 404, 401),
    destructive: true,
  },
  {
    name: 'PUT /api/runs/:id/plan',
    call: (w, a) => request(w.app).put(`/api/runs/${w.runId}/plan`).set(a).send({ plan_id: null }),
    expected: s(204, 404, 404, 404, 404, 401),
    destructive: true,
  },
  {
    name: 'GET /api/runs?runner_id=',
    call: (w, a) => request(w.app).get(`/api/runs?runner_id=${w.ownerId}`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'GET /api/plans/:id',
    call: (w, a) => request(w.app).get(`/api/plans/${w.planId}`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'GET /api/plans?runner_id=',
    call: (w, a) => request(w.app).get(`/api/plans?runner_id=${w.ownerId}`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'POST /api/plans for the runner',
    call: (w, a) =>
      request(w.app).post('/api/plans').set(a).send({ date: '2012-10-25', text: '5 mi easy', runner_id: w.ownerId }),
    expected: s(201, 404, 201, 404, 403, 401),
    destructive: true,
  },
  {
    name: 'PATCH /api/plans/:id',
    call: (w, a) => request(w.app).patch(`/api/plans/${w.planId}`).set(a).send({ title: 'Moved' }),
    expected: s(200, 404, 200, 404, 403, 401),
    destructive: true,
  },
  {
    name: 'DELETE /api/plans/:id',
    call: (w, a) => request(w.app).delete(`/api/plans/${w.planId}`).set(a),
    expected: s(204, 404, 204, 404, 403, 401),
    destructive: true,
  },
  {
    name: 'PUT /api/runners/:id/pace-tolerance',
    call: (w, a) => request(w.app).put(`/api/runners/${w.ownerId}/pace-tolerance`).set(a).send({ pace_tolerance: 0.03 }),
    expected: s(200, 404, 200, 404, 403, 401),
    destructive: true,
  },
  {
    name: 'POST /api/plans/assign',
    call: (w, a) =>
      request(w.app)
        .post('/api/plans/assign')
        .set(a)
        .send({ runner_ids: [w.ownerId], date: '2012-10-26', text: '5 mi easy' }),
    expected: s(201, 404, 201, 404, 403, 401),
    destructive: true,
  },
  {
    name: 'POST /api/plans/copy-week for the runner',
    call: (w, a) =>
      request(w.app)
        .post('/api/plans/copy-week')
        .set(a)
        .send({ runner_id: w.ownerId, from_start: '2012-10-22', to_start: '2012-10-29' }),
    expected: s(201, 404, 201, 404, 403, 401),
    destructive: true,
  },
  {
    name: 'GET /api/plans/:id/changes',
    call: (w, a) => request(w.app).get(`/api/plans/${w.planId}/changes`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'PUT /api/days/:date for the runner',
    call: (w, a) => request(w.app).put('/api/days/2012-10-24').set(a).send({ kind: 'ill', runner_id: w.ownerId }),
    expected: s(200, 404, 200, 404, 403, 401),
    destructive: true,
  },
  {
    name: 'GET /api/days?runner_id=',
    call: (w, a) => request(w.app).get(`/api/days?from=2012-10-22&to=2012-10-28&runner_id=${w.ownerId}`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'GET /api/runners/:id',
    call: (w, a) => request(w.app).get(`/api/runners/${w.ownerId}`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'GET /api/me/goal-race?runner_id=',
    call: (w, a) => request(w.app).get(`/api/me/goal-race?runner_id=${w.ownerId}`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'GET /api/me/race-results?runner_id=',
    call: (w, a) => request(w.app).get(`/api/me/race-results?runner_id=${w.ownerId}`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'GET /api/runners/:id/week',
    call: (w, a) => request(w.app).get(`/api/runners/${w.ownerId}/week?start=${w.week}`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'GET /api/runners/:id/week.csv',
    call: (w, a) => request(w.app).get(`/api/runners/${w.ownerId}/week.csv?start=${w.week}`).set(a),
    expected: s(200, 404, 200, 404, 200, 401),
  },
  {
    name: 'POST /api/runners/:id/weeks/:start/notes',
    call: (w, a) => request(w.app).post(`/api/runners/${w.ownerId}/weeks/${w.week}/notes`).set(a).send({ text: 'Good week.' }),
    expected: s(201, 404, 201, 404, 201, 401),
  },
  {
    name: 'PUT /api/runners/:id/weeks/:start/review',
    call: (w, a) => request(w.app).put(`/api/runners/${w.ownerId}/weeks/${w.week}/review`).set(a).send({ reviewed: true }),
    expected: s(403, 403, 204, 404, 403, 401),
  },
  {
    name: 'GET /api/squads/:id/overview',
    call: (w, a) => request(w.app).get(`/api/squads/${w.squadId}/overview?week=${w.week}`).set(a),
    expected: s(403, 403, 200, 404, 403, 401),
  },
  {
    name: 'GET /api/squads/:id/overview.csv',
    call: (w, a) => request(w.app).get(`/api/squads/${w.squadId}/overview.csv?week=${w.week}`).set(a),
    expected: s(403, 403, 200, 404, 403, 401),
  },
  {
    name: 'POST /api/squads/:id/digest',
    call: (w, a) => request(w.app).post(`/api/squads/${w.squadId}/digest`).set(a).send({}),
    expected: s(403, 403, 200, 404, 403, 401),
  },
  {
    name: 'POST /api/squads/:id/invitations',
    call: (w, a) => request(w.app).post(`/api/squads/${w.squadId}/invitations`).set(a).send({ email: 'x@example.test' }),
    expected: s(403, 403, 201, 404, 403, 401),
  },
  {
    name: 'GET /api/squads/:id/fee',
    call: (w, a) => request(w.app).get(`/api/squads/${w.squadId}/fee`).set(a),
    expected: s(200, 404, 200, 404, 404, 401),
  },
  {
    name: 'PUT /api/squads/:id/fee',
    call: (w, a) =>
      request(w.app).put(`/api/squads/${w.squadId}/fee`).set(a).send({ kind: 'monthly', amount_minor: 5000, currency: 'EUR' }),
    expected: s(403, 403, 200, 404, 403, 401),
  },
  {
    name: 'POST /api/squads/:id/checkout',
    call: (w, a) => request(w.app).post(`/api/squads/${w.squadId}/checkout`).set(a),
    expected: s(201, 404, 404, 404, 404, 401),
  },
  {
    name: 'GET /api/squads/:id/billing',
    call: (w, a) => request(w.app).get(`/api/squads/${w.squadId}/billing`).set(a),
    expected: s(403, 403, 200, 404, 403, 401),
  },
  {
    name: 'GET /api/squads/:id/billing.csv',
    call: (w, a) => request(w.app).get(`/api/squads/${w.squadId}/billing.csv`).set(a),
    expected: s(403, 403, 200, 404, 403, 401),
  },
  {
    name: 'PUT /api/squads/:id/members/:runnerId/fee-waiver',
    call: (w, a) => request(w.app).put(`/api/squads/${w.squadId}/members/${w.ownerId}/fee-waiver`).set(a).send({ waived: true }),
    expected: s(403, 403, 200, 404, 403, 401),
  },
  {
    name: 'GET /api/me/fees',
    call: (w, a) => request(w.app).get('/api/me/fees').set(a),
    expected: s(200, 200, 200, 200, 200, 401),
  },
  {
    name: 'GET /api/admin/users',
    call: (w, a) => request(w.app).get('/api/admin/users').set(a),
    expected: s(403, 403, 403, 403, 200, 401),
  },
];

describe('authorization matrix', () => {
  it.each(CASES.map((c) => [c.name, c] as const))(
    '%s',
    async (_name, testCase) => {
      let world = await buildWorld();
      const got: Partial<Record<ActorName, number>> = {};
      for (const actor of ACTORS) {
        if (testCase.destructive && Object.keys(got).length > 0) {
          await db.raw('truncate users, squads restart identity cascade');
          world = await buildWorld();
        }
        got[actor] = (await testCase.call(world, world.auth[actor])).status;
      }
      expect(got).toEqual(testCase.expected);
    },
    60_000,
  );
});
