/**
 * Password hashing and checking (bcrypt) run in the password threads, never on the event loop: while
 * 20 sign-ins are checked and their hashes brought to the configured cost, `/api/health` answers
 * within the same bound as under big uploads (tests/api/busy-server.api.test.ts). Measured on the real
 * server as a child process, so its event loop is its own.
 */
import bcrypt from 'bcryptjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '../../server/lib/db.ts';
import { healthWhile } from '../support/big-uploads.ts';
import { createUser } from '../support/factories.ts';
import { startServerProcess, type ServerProcess } from '../support/server-process.ts';

/** The bound of busy-server.api.test.ts: /api/health answers within this while others' work goes on. */
const HEALTH_WITHIN_MS = 200;
const SIGN_INS = 20;
/** The server's default cost: each sign-in below makes one cost-12 hash (~0.25 s of one core). */
const COST = 12;

let server: ServerProcess;

beforeAll(async () => {
  server = await startServerProcess({ BCRYPT_COST: String(COST), AUTH_RATE_LIMIT: '1000' });
}, 90_000);

afterAll(async () => {
  await server?.stop();
});

describe('sign-ins under load', () => {
  it(`while ${SIGN_INS} sign-ins are checked and rehashed at cost ${COST}, every /api/health answer comes within ${HEALTH_WITHIN_MS} ms`, async () => {
    // Stored at cost 4 (factories), so each sign-in also makes a new hash at the configured cost.
    const runners = await Promise.all(Array.from({ length: SIGN_INS }, () => createUser()));
    const signIns = Promise.all(
      runners.map(({ user, password }) =>
        fetch(`${server.url}/api/auth/token`, {
          method: 'POST',
          headers: { 'Content-Type': 'application/json' },
          body: JSON.stringify({ email: user.email, password }),
        }).then((res) => res.status),
      ),
    );
    const { result: statuses, samples } = await healthWhile(server.url, signIns);
    const worst = [...samples].sort((a, b) => b.ms - a.ms).slice(0, 3);
    console.log(
      `${SIGN_INS} sign-ins: ${samples.length} health checks over ${(samples.at(-1)!.at / 1000).toFixed(1)} s, slowest ${worst.map((s) => `${s.ms.toFixed(0)} ms`).join(', ')}; limit ${HEALTH_WITHIN_MS} ms`,
    );
    expect(statuses).toEqual(runners.map(() => 200));
    // The hashes were made again at the configured cost (the work measured really happened).
    const rows = await db('users').whereIn(
      'id',
      runners.map((r) => r.user.id),
    );
    expect(rows.map((row: { password_hash: string }) => bcrypt.getRounds(row.password_hash))).toEqual(rows.map(() => COST));
    expect(samples.length).toBeGreaterThanOrEqual(3);
    expect(samples.every((s) => s.status === 200)).toBe(true);
    // Before the password threads, one health answer waited for the bcrypt work of every sign-in.
    expect(Math.max(...samples.map((s) => s.ms))).toBeLessThan(HEALTH_WITHIN_MS);
  }, 120_000);
});
