/**
 * The password threads' full queue (server/features/auth/README.md, "Password work in threads of its
 * own"): with PASSWORD_THREADS=1 at most 64 checks wait for the thread; one more sign-in is refused at
 * once with 503 `busy`, a sentence and Retry-After: 20, changes nothing and counts as no failed attempt. Measured on the real server
 * as a child process with its real pool and limits; the burst is larger than the queue can hold.
 */
import bcrypt from 'bcryptjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PasswordBusyError, PASSWORD_BUSY_RETRY_AFTER_SECONDS } from '../../server/features/auth/password-pool.ts';
import { db } from '../../server/lib/db.ts';
import { createUser } from '../support/factories.ts';
import { startServerProcess, type ServerProcess } from '../support/server-process.ts';

/** The README's bound: checks waiting for a thread before new ones are refused. */
const MAX_WAITING = 64;
/**
 * The configured cost; every account below is stored at it, so a sign-in is one check and no rehash.
 * Cost 10 (~60 ms of one core, a quarter of the default 12) keeps the test short: the queue's bound
 * counts checks, not their cost.
 */
const COST = 10;
/** Sign-ins sent at once: one thread drains ~16 cost-10 checks a second, so 130 sent within ~4 s overfill 1 + 64. */
const BURST = 130;
const PASSWORD = 'queue-full-password-0123';

let server: ServerProcess;

beforeAll(async () => {
  server = await startServerProcess({ BCRYPT_COST: String(COST), PASSWORD_THREADS: '1', AUTH_RATE_LIMIT: '1000' });
}, 90_000);

afterAll(async () => {
  await server?.stop();
});

const signIn = (email: string) =>
  fetch(`${server.url}/api/auth/token`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: PASSWORD }),
  });

const failureCount = async () => Number((await db('credential_failures').count({ n: '*' }).first())!.n);

describe('the password threads with a full queue (PASSWORD_THREADS=1)', () => {
  it(`${BURST} sign-ins at once: past 1 running + ${MAX_WAITING} waiting, the rest get 503 busy with Retry-After at once, and no session`, async () => {
    // One hash shared by every account: the test pays for one hash, the server for one check per sign-in.
    const hash = await bcrypt.hash(PASSWORD, COST);
    const users = await Promise.all(Array.from({ length: BURST }, () => createUser()));
    await db('users')
      .whereIn(
        'id',
        users.map((u) => u.user.id),
      )
      .update({ password_hash: hash });

    const failuresBefore = await failureCount();
    const answers = await Promise.all(
      users.map(async ({ user }) => {
        const res = await signIn(user.email);
        return { id: user.id, status: res.status, retryAfter: res.headers.get('retry-after'), body: await res.json() };
      }),
    );
    const refused = answers.filter((a) => a.status === 503);
    const signedIn = answers.filter((a) => a.status === 200);
    console.log(`${BURST} sign-ins: ${signedIn.length} signed in, ${refused.length} refused as busy`);

    // Every answer is one of the two; the queue's worth (and the running one) were all checked.
    expect(signedIn.length + refused.length).toBe(BURST);
    expect(signedIn.length).toBeGreaterThanOrEqual(MAX_WAITING + 1);
    expect(refused.length).toBeGreaterThan(0);
    for (const answer of refused) {
      expect(answer.body).toEqual({ error: new PasswordBusyError().message, code: 'busy' });
      expect(answer.retryAfter).toBe(String(PASSWORD_BUSY_RETRY_AFTER_SECONDS));
    }
    // A refused sign-in changed nothing: no session for those accounts.
    const sessions = await db('sessions').whereIn(
      'user_id',
      refused.map((a) => a.id),
    );
    expect(sessions).toHaveLength(0);
    // Nor does it count as a failed attempt against the account or the address (README).
    expect(await failureCount()).toBe(failuresBefore);

    // Once the queue has drained, a refused account signs in as usual.
    const again = await signIn(users.find((u) => u.user.id === refused[0]!.id)!.user.email);
    expect(again.status).toBe(200);
  }, 180_000);
});
