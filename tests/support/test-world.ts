import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { expect } from 'vitest';
import { createApp } from '../../server/app.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { createUser } from './factories.ts';
import { recordingMailer, testConfig } from './test-app.ts';

// The small world the hostile-input tables (control characters, date range) send their requests
// into: a runner with one planned session, in a coach's squad, both signed in with a bearer token.

export type App = ReturnType<typeof createApp>;
export type Auth = Record<string, string>;

/** An app over its own throwaway file store; `label` names the temporary folder. */
export function freshApp(label: string): App {
  const dataDir = mkdtempSync(path.join(tmpdir(), `pacewright-${label}-`));
  return createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
}

/** A user of `role`, with a bearer token from `POST /api/auth/token`. */
export async function person(app: App, role: 'runner' | 'coach', name: string) {
  const { user, password } = await createUser({ role, name });
  const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
  return { id: user.id, auth: { Authorization: `Bearer ${token}` } as Auth };
}

export interface World {
  runner: { id: string; auth: Auth };
  coach: { id: string; auth: Auth };
  squad: string;
  plan: string;
}

export async function buildWorld(app: App): Promise<World> {
  const runner = await person(app, 'runner', 'Ivy Runner');
  const coach = await person(app, 'coach', 'Dana Coach');
  const squad = (await request(app).post('/api/squads').set(coach.auth).send({ name: 'Harbor Line' })).body.squad.id as string;
  await db('squad_members').insert({ squad_id: squad, runner_id: runner.id });
  const plan = await request(app).post('/api/plans').set(runner.auth).send({ date: '2026-11-24', text: '45 min easy' });
  expect(plan.status).toBe(201);
  return { runner, coach, squad, plan: plan.body.plan.id as string };
}
