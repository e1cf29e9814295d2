import type { Knex } from 'knex';

/**
 * Issue 19, session 9: a stored track (run_tracks.data) is already gzipped (track-blob.ts), so
 * PostgreSQL's own compression of it (TOAST, pglz by default) only spends time to give up: it keeps
 * compressing until the output passes 75 % of the input before storing it as it came. EXTERNAL keeps the
 * value out of line, as before, without that attempt (PostgreSQL documentation, "TOAST": "EXTERNAL allows
 * out-of-line storage but not compression"). The 30 h file's 2.5 MB insert: median 128 against 183 ms at
 * load 12 (tests/bench/README.md, session 9). Only new values are affected; stored ones read as before.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('alter table run_tracks alter column data set storage external');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('alter table run_tracks alter column data set storage extended');
}
