import { db, readDb, type Db } from '../../lib/db.ts';

/** Adds one to the counters of these runners (a row is made at the first write). */
export async function bumpWeekInputs(runnerIds: readonly string[], trx: Db = db): Promise<void> {
  if (runnerIds.length === 0) return;
  await trx.raw(
    `insert into week_input_counters (runner_id, counter)
     select distinct id, 1 from unnest(?::uuid[]) as ids(id)
     on conflict (runner_id) do update set counter = week_input_counters.counter + 1`,
    [[...runnerIds]],
  );
}

/** Adds one to the counters of the runners who own these runs. */
export async function bumpWeekInputsOfRuns(runIds: readonly string[], trx: Db = db): Promise<void> {
  if (runIds.length === 0) return;
  await trx.raw(
    `insert into week_input_counters (runner_id, counter)
     select distinct user_id, 1 from runs where id = any(?::uuid[])
     on conflict (runner_id) do update set counter = week_input_counters.counter + 1`,
    [[...runIds]],
  );
}

/** Adds one to the counters of every runner in the coach's squads (the coach's name is in their weeks). */
export async function bumpWeekInputsOfCoachedRunners(coachId: string, trx: Db = db): Promise<void> {
  await trx.raw(
    `insert into week_input_counters (runner_id, counter)
     select distinct m.runner_id, 1 from squad_members m join squads s on s.id = m.squad_id where s.coach_id = ?
     on conflict (runner_id) do update set counter = week_input_counters.counter + 1`,
    [coachId],
  );
}

export interface WeekCacheKey {
  runner_id: string;
  week_start: string;
  variant: string;
}

export interface WeekCacheEntry {
  /** The runner's counter now (0 before their first write). */
  counter: string;
  /** The stored week built at this counter and code version, and the runner's local date it was built on; null when none. */
  stored: { body: unknown; today: string } | null;
}

export const weekCacheKeyText = (k: WeekCacheKey) => `${k.runner_id}|${k.week_start}|${k.variant}`;

/**
 * The runners' counters and their stored weeks still valid for them, in one query. `keptAt` (key text → counter)
 * names weeks this process already keeps: their bodies are not read again while the counter is the same.
 */
export async function readWeekCache(
  keys: readonly WeekCacheKey[],
  codeVersion: string,
  keptAt: ReadonlyMap<string, string> = new Map(),
  trx: Db = readDb(),
): Promise<Map<string, WeekCacheEntry>> {
  if (keys.length === 0) return new Map();
  const { rows } = await trx.raw<{
    rows: Array<{ runner_id: string; week_start: string; variant: string; counter: string; body: unknown; today: string | null }>;
  }>(
    `select k.runner_id, k.week_start::text as week_start, k.variant, coalesce(c.counter, 0)::text as counter,
            w.body, w.today::text as today
     from unnest(?::uuid[], ?::date[], ?::text[], ?::text[]) as k(runner_id, week_start, variant, kept_at)
     left join week_input_counters c on c.runner_id = k.runner_id
     left join assembled_weeks w on w.runner_id = k.runner_id and w.week_start = k.week_start and w.variant = k.variant
       and w.counter = coalesce(c.counter, 0) and w.code_version = ?
       and k.kept_at is distinct from coalesce(c.counter, 0)::text`,
    [
      keys.map((k) => k.runner_id),
      keys.map((k) => k.week_start),
      keys.map((k) => k.variant),
      keys.map((k) => keptAt.get(weekCacheKeyText(k)) ?? ''),
      codeVersion,
    ],
  );
  return new Map(
    rows.map((r) => [
      weekCacheKeyText(r),
      { counter: r.counter, stored: r.today === null ? null : { body: r.body, today: r.today } },
    ]),
  );
}

/** Stores built weeks; a week built at an older counter never replaces one built at a newer. */
export async function storeWeeks(
  rows: ReadonlyArray<WeekCacheKey & { counter: string; code_version: string; today: string; body: unknown }>,
  trx: Db = db,
): Promise<void> {
  if (rows.length === 0) return;
  await trx('assembled_weeks')
    .insert(rows.map((r) => ({ ...r, body: JSON.stringify(r.body), computed_at: new Date() })))
    .onConflict(['runner_id', 'week_start', 'variant'])
    .merge()
    .where('assembled_weeks.counter', '<=', trx.raw('excluded.counter'));
}

/**
 * Drops every stored week that names the user (a coach's notes or review in a runner's week): account deletion.
 * Their runners' counters move on too, so no web process goes on serving a week it keeps in memory.
 */
export async function forgetWeeksNaming(userId: string, trx: Db = db): Promise<void> {
  await trx.raw(
    `with named as (delete from assembled_weeks where strpos(body::text, ?) > 0 returning runner_id)
     insert into week_input_counters (runner_id, counter)
     select distinct runner_id, 1 from named
     on conflict (runner_id) do update set counter = week_input_counters.counter + 1`,
    [userId],
  );
}

/** One runner's input counter (0 before their first counted write); a replica may serve it. */
export async function readInputsCounter(runnerId: string, trx: Db = readDb()): Promise<string> {
  const row = (await trx('week_input_counters').where({ runner_id: runnerId }).first(trx.raw('counter::text as counter'))) as
    { counter: string } | undefined;
  return row?.counter ?? '0';
}
