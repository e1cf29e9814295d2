import type { Knex } from 'knex';

/**
 * Issue 19, session 10: an upload stores a run's track while the rest of the run is still being analysed
 * (server/features/runs/README.md, "The store beside the analysis"): the track row goes in before its run's
 * row, in the same transaction. The reference to runs is therefore checked at COMMIT (PostgreSQL documentation,
 * CREATE TABLE, "DEFERRABLE … INITIALLY DEFERRED"); a transaction that ends without the run's row fails
 * there and stores nothing. ON DELETE CASCADE is unchanged (referential actions are never deferred).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`alter table run_tracks
    drop constraint run_tracks_run_id_foreign,
    add constraint run_tracks_run_id_foreign foreign key (run_id) references runs (id) on delete cascade
      deferrable initially deferred`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`alter table run_tracks
    drop constraint run_tracks_run_id_foreign,
    add constraint run_tracks_run_id_foreign foreign key (run_id) references runs (id) on delete cascade`);
}
