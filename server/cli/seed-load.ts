/**
 * `npm run seed:load`: a big generated history for trying pages and query plans at scale, in its own
 * database `pacewright_load` on the embedded cluster (or the DATABASE_URL database when given).
 * LOAD_RUNNERS runners (default 50) × LOAD_YEARS years (default 3) of daily runs, a rest day a week,
 * each a GPX around the invented Lake Tamsel imported through the real `importFiles`; plans for every
 * training day, coach reviews and notes, squads of ≤ 25 runners with a coach each. The plan is db/load/load-plan.ts.
 * Resumable: a runner whose every run is already stored is skipped; a half-done runner gets only the
 * missing days. Originals go to DATA_DIR (default `.data/load`, apart from the demo's `.data`).
 */
import path from 'node:path';
import bcrypt from 'bcryptjs';
import type { UserRow } from '../lib/db.ts';
import {
  LOAD_DOMAIN,
  LOAD_PASSWORD,
  LOAD_TIME_ZONE,
  loadCoachCount,
  loadCoachEmail,
  loadCoachName,
  loadDates,
  loadRunnerEmail,
  loadRunnerName,
  loadRunnerProfile,
  loadSessionsOf,
  loadWeekFeedback,
  parseLoadSettings,
  planLoadSquads,
  type LoadSession,
} from '../../db/load/load-plan.ts';
import { parseShorthand } from '../../shared/plans/shorthand.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { addDays } from '../../shared/weeks/weeks.ts';
import { ROOT, startEmbeddedPostgres, usesExternalDatabase, withDatabase } from './lib/postgres.ts';

const LOAD_DATABASE = 'pacewright_load';

const parsedSettings = parseLoadSettings(process.env);
if (!parsedSettings.ok) {
  console.error(parsedSettings.error);
  process.exit(2);
}
const settings = parsedSettings.settings;

if (usesExternalDatabase()) {
  console.log(`DATABASE_URL is set: loading into its database "${new URL(process.env.DATABASE_URL!).pathname.slice(1)}".`);
} else {
  process.env.DATABASE_URL = withDatabase(startEmbeddedPostgres([LOAD_DATABASE]), LOAD_DATABASE);
  console.log(`Loading into the embedded database "${LOAD_DATABASE}".`);
}
const dataDir = process.env.DATA_DIR ? path.resolve(process.env.DATA_DIR) : path.join(ROOT, '.data/load');

const { db } = await import('../lib/db.ts');
const { importFiles } = await import('../features/runs/runs.service.ts');
const { createStoreFromEnv } = await import('../lib/storage.ts');

const started = Date.now();
const seconds = (ms: number) => `${(ms / 1000).toFixed(1)} s`;
const clock = () => {
  const s = Math.round((Date.now() - started) / 1000);
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`;
};

/** The users with these e-mails, inserting the missing ones (one bcrypt hash for all: cost 10 on purpose). */
async function ensureUsers(
  people: Array<{ email: string; name: string; role: 'runner' | 'coach' }>,
): Promise<Map<string, UserRow>> {
  const emails = people.map((p) => p.email);
  const existing = (await db('users').whereIn('email', emails)) as UserRow[];
  const have = new Set(existing.map((u) => u.email));
  const missing = people.filter((p) => !have.has(p.email));
  if (missing.length) {
    const hash = await bcrypt.hash(LOAD_PASSWORD, 10);
    const rows = missing.map((p) => ({ ...p, unit: 'km' as const, time_zone: LOAD_TIME_ZONE, password_hash: hash }));
    existing.push(...((await db('users').insert(rows).returning('*')) as UserRow[]));
  }
  return new Map(existing.map((u) => [u.email, u]));
}

function gpxOf(session: LoadSession): { name: string; data: Buffer } {
  const run = generateLakeRun({
    start_t: session.start_t,
    phases: session.phases,
    seed: session.seed,
    sample_s: session.sample_s,
    gps_sigma_m: 1.5,
    ele_sigma_m: 0.8,
  });
  return { name: `tamsel ${session.kind} ${session.date}.gpx`, data: Buffer.from(writeGpx(session.title, [run.points])) };
}

/** Plans, reviews and notes of one runner, written afresh (so a resumed runner never gets them twice). */
async function writePlansAndFeedback(runner: UserRow, coach: UserRow, sessions: LoadSession[], dates: string[]): Promise<void> {
  const number = Number(runner.email.slice('runner'.length, 'runner'.length + 3));
  await db.transaction(async (trx) => {
    await trx('session_plans').where({ runner_id: runner.id }).delete();
    await trx('week_reviews').where({ runner_id: runner.id }).delete();
    await trx('week_notes').where({ runner_id: runner.id }).delete();
    const plans = sessions.map((s) => {
      const parsed = parseShorthand(s.plan);
      if (!parsed.ok) throw new Error(`load plan does not parse: ${s.plan}: ${parsed.error.message}`);
      return { runner_id: runner.id, author_id: coach.id, date: s.date, title: s.title, items: JSON.stringify(parsed.items) };
    });
    await trx.batchInsert('session_plans', plans, 500);
    const feedback = loadWeekFeedback(loadRunnerProfile(number), dates);
    const reviews = feedback
      .filter((f) => f.reviewed)
      .map((f) => ({
        runner_id: runner.id,
        week_start: f.week_start,
        coach_id: coach.id,
        reviewed_at: `${addDays(f.week_start, 7)}T18:00:00Z`,
      }));
    await trx.batchInsert('week_reviews', reviews, 500);
    const notes = feedback.flatMap((f) =>
      f.note ? [{ runner_id: runner.id, week_start: f.week_start, author_id: coach.id, text: f.note }] : [],
    );
    await trx.batchInsert('week_notes', notes, 500);
  });
}

try {
  await db.migrate.latest();
  const store = await createStoreFromEnv(dataDir);
  const end = process.env.LOAD_END ?? addDays(new Date().toISOString().slice(0, 10), -1);
  const dates = loadDates(end, settings.years);
  const squads = planLoadSquads(settings.runners);
  console.log(
    `${settings.runners} runners × ${settings.years} years (${dates[0]} to ${end}), ${squads.length} squads, ` +
      `${loadCoachCount(squads)} coaches; originals in ${path.relative(ROOT, dataDir) || dataDir}.`,
  );

  const coachNumbers = Array.from({ length: loadCoachCount(squads) }, (_, i) => i + 1);
  const runnerNumbers = Array.from({ length: settings.runners }, (_, i) => i + 1);
  const users = await ensureUsers([
    ...coachNumbers.map((n) => ({ email: loadCoachEmail(n), name: loadCoachName(n), role: 'coach' as const })),
    ...runnerNumbers.map((n) => ({ email: loadRunnerEmail(n), name: loadRunnerName(n), role: 'runner' as const })),
  ]);
  const coachOf = new Map<number, UserRow>();
  for (const squad of squads) {
    const coach = users.get(loadCoachEmail(squad.coach))!;
    // Found by name and brought in line with the plan, so a load resumed with other settings stays consistent.
    const found = await db('squads').where({ name: squad.name }).first();
    const squadId = found?.id ?? (await db('squads').insert({ coach_id: coach.id, name: squad.name }).returning('id'))[0]!.id;
    if (found && found.coach_id !== coach.id) await db('squads').where({ id: squadId }).update({ coach_id: coach.id });
    const memberIds = squad.runners.map((n) => users.get(loadRunnerEmail(n))!.id);
    await db('squad_members').where({ squad_id: squadId }).whereNotIn('runner_id', memberIds).delete();
    await db('squad_members')
      .insert(memberIds.map((id) => ({ squad_id: squadId, runner_id: id })))
      .onConflict(['squad_id', 'runner_id'])
      .ignore();
    for (const n of squad.runners) coachOf.set(n, coach);
  }

  let importedTotal = 0;
  let skipped = 0;
  const importOne = async (number: number): Promise<void> => {
    const t0 = Date.now();
    const runner = users.get(loadRunnerEmail(number))!;
    const profile = loadRunnerProfile(number);
    const sessions = loadSessionsOf(profile, dates);
    const stored = new Set(
      (await db('runs').where({ user_id: runner.id }).distinct('local_date')).map((r: { local_date: string }) => r.local_date),
    );
    const missing = sessions.filter((s) => !stored.has(s.date));
    if (missing.length === 0) {
      skipped++;
      console.log(`${loadRunnerName(number)}: complete already (${sessions.length} runs), skipped  [${clock()}]`);
      return;
    }
    await db('goal_races')
      .insert({
        user_id: runner.id,
        name: 'Lake Tamsel Marathon',
        date: addDays(end, 70),
        distance_m: 42195,
        goal_time_s: Math.round(42195 / (profile.speed_mps * 1.02)),
      })
      .onConflict('user_id')
      .merge();
    await writePlansAndFeedback(runner, coachOf.get(number)!, sessions, dates);
    let imported = 0;
    let duplicates = 0;
    for (let i = 0; i < missing.length; i += settings.batch) {
      const result = await importFiles(runner, missing.slice(i, i + settings.batch).map(gpxOf), store);
      if (result.rejected.length) throw new Error(`load runs rejected: ${JSON.stringify(result.rejected.slice(0, 3))}`);
      imported += result.imported.length;
      duplicates += result.duplicates.length;
    }
    importedTotal += imported;
    const ms = Date.now() - t0;
    console.log(
      `${loadRunnerName(number)}: ${imported} runs imported` +
        (stored.size ? ` (${stored.size} were there already)` : '') +
        (duplicates ? `, ${duplicates} files already stored without their run` : '') +
        ` in ${seconds(ms)}, ${(imported / (ms / 1000)).toFixed(1)} runs/s  [${clock()}]`,
    );
  };

  // A few runners at once: one runner's database round trips overlap another's parsing.
  const queue = [...runnerNumbers];
  await Promise.all(
    Array.from({ length: Math.min(settings.concurrency, queue.length) }, async () => {
      for (let n = queue.shift(); n !== undefined; n = queue.shift()) await importOne(n);
    }),
  );

  await db.raw('analyze');
  const ms = Date.now() - started;
  const [{ runs }] = (await db('runs').count({ runs: '*' })) as [{ runs: string }];
  const [{ splits }] = (await db('run_splits').count({ splits: '*' })) as [{ splits: string }];
  const [{ plans }] = (await db('session_plans').count({ plans: '*' })) as [{ plans: string }];
  const size = (await db.raw('select pg_size_pretty(pg_database_size(current_database())) as size')).rows[0].size as string;
  console.log(
    `\nDone in ${seconds(ms)}: ${importedTotal} runs imported (${(importedTotal / (ms / 1000)).toFixed(1)} runs/s overall), ` +
      `${skipped} runners already complete.\nThe database now holds ${runs} runs, ${splits} splits, ${plans} session plans (${size}).` +
      `\nSign in as ${loadCoachEmail(1)} or ${loadRunnerEmail(1)} with the password ${LOAD_PASSWORD} (${LOAD_DOMAIN} is invented).`,
  );
} finally {
  await db.destroy();
}
