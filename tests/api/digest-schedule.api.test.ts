import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { db } from '../../server/lib/db.ts';
import { DIGEST_QUEUE } from '../../server/features/weeks/digest-job.ts';
import { todayIn } from '../../shared/runs/local-time.ts';
import { mondayOf } from '../../shared/plans/weeks.ts';
import { addDays } from '../../shared/weeks/weeks.ts';
import { createUser } from '../support/factories.ts';
import { waitUntil } from '../support/poll.ts';
import { startAppProcess, type AppProcess } from '../support/server-process.ts';

/**
 * Issue 19: the weekly digest is a scheduled worker job. Two `npm run worker` processes on one database with
 * DIGEST_SCHEDULE every minute: pg-boss's real scheduler makes one job per minute slot and one worker takes it, so
 * each round e-mails each coach once, not once per worker. DIGEST_SCHEDULE=off removes the schedule; a text that is
 * not a cron stops the worker with a sentence.
 */

const JWT_SECRET = 'digest-schedule-test-secret-0123456789ab';
const EVERY_MINUTE = '* * * * *';
const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-digest-schedule-'));
const env = { JWT_SECRET, DATA_DIR: dataDir, BCRYPT_COST: '4' };
const workers: AppProcess[] = [];

let coachEmail = '';
let quietCoachEmail = '';
let squadName = '';

/** A coach with a squad of one runner, and a coach who switched the digest off (each test starts from empty tables). */
async function squadsWithCoaches(): Promise<void> {
  const stamp = Date.now();
  const coach = await createUser({ role: 'coach', name: 'Rook Digest', email: `rook-${stamp}@example.test` });
  const quiet = await createUser({ role: 'coach', name: 'Lark Quiet', email: `lark-${stamp}@example.test` });
  const runner = await createUser({ name: 'Fen Runner', email: `fen-${stamp}@example.test` });
  await db('users').where({ id: quiet.user.id }).update({ notify_on_digest: false });
  squadName = `Digest squad ${stamp}`;
  const [squad] = await db('squads').insert({ coach_id: coach.user.id, name: squadName }).returning('id');
  const [quietSquad] = await db('squads')
    .insert({ coach_id: quiet.user.id, name: `Quiet squad ${stamp}` })
    .returning('id');
  await db('squad_members').insert([
    { squad_id: squad!.id, runner_id: runner.user.id },
    { squad_id: quietSquad!.id, runner_id: runner.user.id },
  ]);
  coachEmail = coach.user.email;
  quietCoachEmail = quiet.user.email;
}

afterAll(async () => {
  await Promise.all(workers.map((w) => w.stop()));
  // The schedule lives in the database: leave none firing every minute for the test files after this one.
  await db.raw('delete from pgboss.schedule where name = ?', [DIGEST_QUEUE]).catch(() => undefined);
  rmSync(dataDir, { recursive: true, force: true });
}, 120_000);

type JobRow = { id: string; state: string; created_on: Date };

const digestJobs = async (): Promise<JobRow[]> =>
  (await db.raw('select id, state, created_on from pgboss.job where name = ? order by created_on', [DIGEST_QUEUE]))
    .rows as JobRow[];

const digestsTo = (to: string) => db('dev_outbox').where({ to }).andWhereLike('subject', '%: week of %').select('subject');

describe('the weekly digest as a scheduled worker job', () => {
  it('two workers on one database send each scheduled round once, not once per worker', async () => {
    await squadsWithCoaches();
    // The week each round reports, read on the clock before the first round and after the last: the same week unless
    // the rounds straddle the midnight (UTC) that makes yesterday a Monday: then the later rounds rightly report the next week.
    const weekOfYesterday = () => mondayOf(addDays(todayIn('UTC'), -1));
    const weekBefore = weekOfYesterday();
    for (let i = 0; i < 2; i++) workers.push(await startAppProcess('worker', { ...env, DIGEST_SCHEDULE: EVERY_MINUTE }));
    for (const worker of workers) {
      const started = worker.logs.find((l) => l.msg === 'Pacewright worker is running (no HTTP)');
      expect(started?.jobs).toContain(`weekly digests (${EVERY_MINUTE})`);
    }

    // Two rounds done: the first minute slot is over, so every cron check of both workers for it has run.
    await waitUntil(
      async () => (await digestJobs()).filter((j) => j.state === 'completed').length >= 2,
      'two digest rounds to complete',
      240_000,
    );
    // A clean stop lets a round in hand finish; after it nothing more is sent.
    await Promise.all(workers.map((w) => w.stop()));

    const jobs = await digestJobs();
    const completed = jobs.filter((j) => j.state === 'completed');
    expect(completed.length).toBeGreaterThanOrEqual(2);
    expect(jobs.every((j) => j.state === 'completed' || j.state === 'created')).toBe(true);
    // One job per minute slot: pg-boss's cron check (whichever worker watched the clock) queues a "send it" job keyed
    // by the schedule's name with a 60 s singleton slot, and each of those made exactly one digest job.
    const slots = (
      await db.raw(
        `select singleton_on from pgboss.job where name = '__pgboss__send-it' and singleton_key = ? and state = 'completed'`,
        [DIGEST_QUEUE],
      )
    ).rows as Array<{ singleton_on: Date }>;
    expect(new Set(slots.map((s) => new Date(s.singleton_on).getTime())).size).toBe(slots.length);
    expect(jobs).toHaveLength(slots.length);
    // And end to end: the slots are whole minutes, each a minute or more after the one before, and the n-th round was
    // queued within the n-th slot or later. (Not the gap between rounds: a cron check that runs late on a busy machine puts
    // one round 20-30 s after the slot's start and the next on time; that is the scheduler's allowance, not a fault.)
    // Epoch milliseconds from PostgreSQL: singleton_on has no zone, which the driver would read on this machine's clock.
    const slotStarts = (
      await db.raw(
        `select extract(epoch from singleton_on) * 1000 as ms from pgboss.job
          where name = '__pgboss__send-it' and singleton_key = ? and state = 'completed' order by singleton_on`,
        [DIGEST_QUEUE],
      )
    ).rows.map((r: { ms: string }) => Number(r.ms)) as number[];
    const roundsQueued = (
      await db.raw(`select extract(epoch from created_on) * 1000 as ms from pgboss.job where name = ? order by created_on`, [
        DIGEST_QUEUE,
      ])
    ).rows.map((r: { ms: string }) => Number(r.ms)) as number[];
    expect(roundsQueued).toHaveLength(slotStarts.length);
    for (const [i, start] of slotStarts.entries()) {
      expect(start % 60_000).toBe(0);
      if (i > 0) expect(start - slotStarts[i - 1]!).toBeGreaterThanOrEqual(60_000);
      expect(roundsQueued[i]!).toBeGreaterThanOrEqual(start);
    }

    // No round failed for this squad (the job logs each squad that failed with its reason).
    const rounds = workers.flatMap((w) => w.logs.filter((l) => l.msg === 'weekly digest round finished'));
    const failures = rounds.flatMap((r) => (r.failed as Array<{ squad: string }>).filter((f) => f.squad === squadName));
    expect(failures).toEqual([]);

    // Each round e-mailed the coach once: as many digests as rounds, none doubled by the second worker.
    const mails = await digestsTo(coachEmail);
    expect(mails).toHaveLength(completed.length);
    // The scheduled round reports the week holding yesterday (the profile's zone, UTC here): Monday 06:00 → the week just ended.
    const weeks = new Set([weekBefore, weekOfYesterday()]);
    for (const mail of mails) expect([...weeks].map((week) => `${squadName}: week of ${week}`)).toContain(mail.subject);
    // A coach who switched the digest off gets none.
    expect(await digestsTo(quietCoachEmail)).toHaveLength(0);

    // Each round was taken by one worker: the rounds logged across both equal the jobs completed.
    expect(rounds).toHaveLength(completed.length);
    console.log(
      `digest schedule: ${completed.length} rounds, ${mails.length} e-mails to the coach, rounds per worker ${workers
        .map((w) => w.logs.filter((l) => l.msg === 'weekly digest round finished').length)
        .join(' + ')}`,
    );
  }, 400_000);

  it('DIGEST_SCHEDULE=off removes the schedule; a text that is not a cron stops the worker with a sentence', async () => {
    const schedules = async () =>
      (
        (await db.raw('select name, cron from pgboss.schedule where name = ?', [DIGEST_QUEUE])).rows as Array<{ cron: string }>
      ).map((r) => r.cron);
    expect(await schedules()).toEqual([EVERY_MINUTE]); // left by the workers above
    const off = await startAppProcess('worker', { ...env, DIGEST_SCHEDULE: 'off' });
    workers.push(off);
    expect(off.logs.find((l) => l.msg === 'Pacewright worker is running (no HTTP)')?.jobs).toContain('weekly digests (off)');
    expect(await schedules()).toEqual([]);
    await off.stop();

    await expect(startAppProcess('worker', { ...env, DIGEST_SCHEDULE: 'every monday' })).rejects.toThrow(
      /Pacewright worker cannot start: DIGEST_SCHEDULE must be "off" or a cron text of five fields/,
    );
    // Five fields of the right shape that pg-boss cannot read: refused when the schedule is set, in a sentence.
    await expect(startAppProcess('worker', { ...env, DIGEST_SCHEDULE: '99 6 * * 1' })).rejects.toThrow(
      /Pacewright worker cannot start: DIGEST_SCHEDULE "99 6 \* \* 1" is not a cron text/,
    );
    expect(await schedules()).toEqual([]);
  }, 300_000);
});
