import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // Request counts of the express-rate-limit limiters (server/lib/postgres-rate-limit-store.ts): one
  // row per limiter and caller, a fixed window from the first request; every web process counts here.
  await knex.schema.createTable('rate_limit_hits', (t) => {
    t.text('key').primary();
    t.integer('hits').notNullable();
    t.timestamp('reset_at', { useTz: true }).notNullable();
    t.index(['reset_at']);
  });
  // Uploads arriving at once (server/lib/upload-slots.ts): one leased row per upload in progress,
  // renewed while it arrives, so a process that dies frees its slots when the lease runs out.
  await knex.schema.createTable('upload_slots', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('kind').notNullable();
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.index(['kind', 'user_id', 'expires_at']);
    t.index(['expires_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('upload_slots');
  await knex.schema.dropTable('rate_limit_hits');
}
