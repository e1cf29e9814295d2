import type { Knex } from 'knex';

/**
 * Issue 19, session 10: how a stored track's columns are laid out inside its gzip blob
 * (server/features/runs/track-blob.ts, `TrackLayout`). Every row stored before holds plain columns, which is
 * the default, so they read as before; new tracks are written as XOR byte planes (smaller, and a quarter of
 * the gzip CPU) and say so. A constant default is only catalogue data in PostgreSQL 11+ (no table rewrite).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(
    "alter table run_tracks add column data_layout text not null default 'columns' check (data_layout in ('columns', 'xor-planes'))",
  );
}

export async function down(knex: Knex): Promise<void> {
  // Without the column every blob would be read as plain columns: refuse while any track holds XOR planes.
  const { rows } = await knex.raw<{ rows: unknown[] }>("select 1 from run_tracks where data_layout <> 'columns' limit 1");
  if (rows.length > 0)
    throw new Error('run_tracks holds tracks stored as XOR planes; the code before this migration cannot read them');
  await knex.raw('alter table run_tracks drop column data_layout');
}
