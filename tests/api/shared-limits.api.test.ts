import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config.ts';
import { db } from '../../server/lib/db.ts';
import { uploadSlotsHeldBy } from '../../server/lib/shared-limits.repository.ts';
import { streamMultipart, uploadLeftOpen, writeLongGpx } from '../support/big-uploads.ts';
import { createUser } from '../support/factories.ts';
import { bearerFor, startAppProcess, type AppProcess } from '../support/server-process.ts';
import { waitUntil } from '../support/poll.ts';

/**
 * Shared limits (issue 19): two web processes (ROLE=web) on one database, with the limits a
 * deployment has (no number lifted), and requests split between them. Each limit counts once for
 * both: the sign-in limit, the sign-up and reset requests per address, a per-user rate limit and
 * the uploads arriving at once; and the upload slots of a process killed mid-upload free themselves.
 */

const JWT_SECRET = 'shared-limits-test-secret-0123456789abcdef';
const REAL = loadConfig({ NODE_ENV: 'test' });
const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-shared-limits-'));
const work = mkdtempSync(path.join(tmpdir(), 'pacewright-shared-limits-files-'));
const env = { JWT_SECRET, DATA_DIR: dataDir, BCRYPT_COST: '4' };
const started: AppProcess[] = [];
let webA: AppProcess;
let webB: AppProcess;

beforeAll(async () => {
  // One at a time: two cold starts at once only compete for the same two cores.
  webA = await startAppProcess('web', env);
  started.push(webA);
  webB = await startAppProcess('web', env);
  started.push(webB);
}, 300_000);

afterAll(async () => {
  await Promise.all(started.map((p) => p.stop()));
  rmSync(dataDir, { recursive: true, force: true });
  rmSync(work, { recursive: true, force: true });
}, 120_000);

/** Request `i` goes to A when even, to B when odd: the split a load balancer makes. */
const webFor = (i: number) => (i % 2 === 0 ? webA : webB);

async function post(url: string, body: unknown, headers: Record<string, string> = {}) {
  const res = await fetch(url, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', ...headers },
    body: JSON.stringify(body),
  });
  return { status: res.status, body: (await res.json().catch(() => null)) as { code?: string; error?: string } | null };
}

async function smallGpx(name: string) {
  const file = path.join(work, name);
  await writeLongGpx(file, { points: 600, stepS: 1, startMs: Date.UTC(2026, 9, 1, 6), seed: 3 });
  return { field: 'files', filename: name, path: file };
}

describe('two web processes on one database enforce one limit', () => {
  it(`sign-in: ${REAL.authRateLimit.max} wrong passwords split between the processes, then both refuse`, async () => {
    const { user } = await createUser();
    const statuses: number[] = [];
    for (let i = 0; i < REAL.authRateLimit.max; i++) {
      statuses.push(
        (await post(`${webFor(i).url}/api/auth/login`, { email: user.email, password: `wrong-${i}-password` })).status,
      );
    }
    expect(statuses).toEqual(Array(REAL.authRateLimit.max).fill(401));
    for (const web of [webA, webB]) {
      const refused = await post(`${web.url}/api/auth/login`, { email: user.email, password: 'another-wrong-one' });
      expect(refused.status).toBe(429);
      expect(refused.body?.error).toMatch(/^Too many wrong passwords for this account or from this address\./);
    }
  }, 120_000);

  it(`sign-up and reset requests: ${REAL.authRateLimit.max} from one address split between the processes, then both refuse`, async () => {
    const statuses: number[] = [];
    for (let i = 0; i < REAL.authRateLimit.max; i++) {
      statuses.push((await post(`${webFor(i).url}/api/auth/password-reset`, { email: `reset-${i}@example.test` })).status);
    }
    expect(statuses).toEqual(Array(REAL.authRateLimit.max).fill(202));
    for (const web of [webA, webB]) {
      const refused = await post(`${web.url}/api/auth/register`, {
        email: `late-${web.pid}@example.test`,
        password: 'a-long-enough-password',
        name: 'Late Comer',
        role: 'runner',
      });
      expect(refused.status).toBe(429);
      expect(refused.body).toMatchObject({
        code: 'too-many-attempts',
        error: 'Too many requests from this address. Please wait a few minutes and try again.',
      });
    }
    // One count for the address, not one per process.
    const rows = await db('rate_limit_hits').where('key', 'like', 'sign-up-and-reset:%').select('hits');
    expect(rows.map((r) => Number(r.hits))).toEqual([REAL.authRateLimit.max + 2]);
  }, 120_000);

  it(`a per-user rate limit: ${REAL.recomputeRateLimit.max} pace-tolerance changes split between the processes, then both refuse`, async () => {
    const { user, password } = await createUser();
    const authorization = await bearerFor(webA.url, user.email, password);
    const change = async (web: AppProcess, tolerance: number) => {
      const res = await fetch(`${web.url}/api/runners/${user.id}/pace-tolerance`, {
        method: 'PUT',
        headers: { Authorization: authorization, 'Content-Type': 'application/json' },
        body: JSON.stringify({ pace_tolerance: tolerance }),
      });
      return { status: res.status, body: (await res.json()) as { code?: string; error?: string } };
    };
    const statuses: number[] = [];
    for (let i = 0; i < REAL.recomputeRateLimit.max; i++) statuses.push((await change(webFor(i), 0.01 + (i % 5) / 1000)).status);
    expect(statuses).toEqual(Array(REAL.recomputeRateLimit.max).fill(200));
    for (const web of [webA, webB]) {
      const refused = await change(web, 0.03);
      expect(refused.status).toBe(429);
      expect(refused.body).toMatchObject({
        code: 'too-many-changes',
        error: `The pace tolerance can be changed ${REAL.recomputeRateLimit.max} times in 60 minutes, as every change rechecks all runs against their plans. Please try again later.`,
      });
    }
  }, 120_000);

  it(`uploads arriving at once: ${REAL.uploadsAtOncePerUser} on one process fill the user's places on the other; one ending frees one`, async () => {
    expect(REAL.uploadsAtOncePerUser).toBe(2);
    const { user, password } = await createUser();
    const authorization = { Authorization: await bearerFor(webA.url, user.email, password) };
    const open = [uploadLeftOpen(`${webA.url}/api/runs`, authorization), uploadLeftOpen(`${webA.url}/api/runs`, authorization)];
    await waitUntil(async () => (await uploadSlotsHeldBy(user.id)) === 2, 'both uploads let in on A');

    const file = await smallGpx('shared-limits-one.gpx');
    const third = await streamMultipart(`${webB.url}/api/runs`, authorization, [file]);
    expect(third.status).toBe(429);
    expect(third.body).toMatchObject({
      code: 'uploads-in-progress',
      error: 'You already have 2 uploads arriving. Wait until they are finished, then send the next files.',
    });

    open[0]!.destroy();
    await waitUntil(async () => (await uploadSlotsHeldBy(user.id)) === 1, 'the broken-off upload’s place given back');
    const after = await streamMultipart(`${webB.url}/api/runs`, authorization, [file]);
    expect(after.status, after.text).toBe(201);
    open[1]!.destroy();
    await waitUntil(async () => (await uploadSlotsHeldBy(user.id)) === 0, 'every place given back');
  }, 120_000);

  it(`a process killed mid-upload frees its places within the ${REAL.uploadSlotLeaseMs / 1000} s lease, with no restart`, async () => {
    const doomed = await startAppProcess('web', env);
    started.push(doomed);
    const { user, password } = await createUser();
    const authorization = { Authorization: await bearerFor(webA.url, user.email, password) };
    for (let i = 0; i < REAL.uploadsAtOncePerUser; i++) uploadLeftOpen(`${doomed.url}/api/runs`, authorization);
    await waitUntil(async () => (await uploadSlotsHeldBy(user.id)) === 2, 'both uploads let in on the doomed process');
    const file = await smallGpx('shared-limits-two.gpx');
    expect((await streamMultipart(`${webB.url}/api/runs`, authorization, [file])).status).toBe(429);

    const exited = new Promise<void>((resolve) => doomed.child.once('exit', () => resolve()));
    doomed.child.kill('SIGKILL');
    await exited;
    const killedAt = Date.now();
    // Nothing gave the places back: they are still held right after the kill …
    expect(await uploadSlotsHeldBy(user.id)).toBeGreaterThan(0);
    // … until their lease runs out (renewed every third of it while the process lived).
    await waitUntil(
      async () => (await uploadSlotsHeldBy(user.id)) === 0,
      'the killed process’s places to free themselves',
      REAL.uploadSlotLeaseMs + 30_000,
    );
    const freedAfterMs = Date.now() - killedAt;
    console.log(`shared limits: a killed process's 2 upload places were free ${freedAfterMs} ms after the kill`);
    expect(freedAfterMs).toBeLessThanOrEqual(REAL.uploadSlotLeaseMs + 5_000);

    const after = await streamMultipart(`${webB.url}/api/runs`, authorization, [file]);
    expect(after.status, after.text).toBe(201);
  }, 300_000);
});
