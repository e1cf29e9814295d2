import type { Knex } from 'knex';
import { TIME_ZONE_ALIASES } from '../../shared/users/time-zones.ts';

/**
 * Issue 17: time zones are stored under their current IANA names. Rows saved from a browser's Intl
 * list (Asia/Calcutta, Europe/Kiev…) or tz-lookup are renamed from the alias table in
 * shared/users/time-zones.ts; the same clock, so no run's local date changes. Both tables that hold a
 * zone: users.time_zone (the profile) and runs.time_zone (where each run started).
 */
const TABLES = ['users', 'runs'] as const;

export async function up(knex: Knex): Promise<void> {
  const pairs = Object.entries(TIME_ZONE_ALIASES);
  for (const table of TABLES) {
    // One statement per table: join against the alias list instead of one update per name.
    await knex.raw(
      `update ?? as t set time_zone = a.canonical
         from (select * from unnest(?::text[], ?::text[]) as x(alias, canonical)) as a
        where t.time_zone = a.alias`,
      [table, pairs.map(([alias]) => alias), pairs.map(([, canonical]) => canonical)],
    );
  }
}

/** Nothing to undo: the current names mean the same clocks, and which old name a row had is not kept. */
export async function down(): Promise<void> {}
