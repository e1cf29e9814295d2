import type { Knex } from 'knex';

/**
 * Indexes the query plans on the generated history asked for (DEVELOPERS.md, "Query plans at scale").
 * Foreign keys get no index of their own in PostgreSQL: without these, finding a source file's run (an
 * import's duplicate check, deleting a run) and every cascade from a deleted file or user scan whole tables.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('runs', (t) => {
    t.index(['source_file_id']);
    // The week review's and the squad overview's "last upload": one index entry instead of every run.
    t.index(['user_id', 'created_at']);
  });
  await knex.schema.alterTable('session_plans', (t) => {
    t.index(['author_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('session_plans', (t) => {
    t.dropIndex(['author_id']);
  });
  await knex.schema.alterTable('runs', (t) => {
    t.dropIndex(['user_id', 'created_at']);
    t.dropIndex(['source_file_id']);
  });
}
