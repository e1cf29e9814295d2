import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // One goal race per runner: the race they train for now.
  await knex.schema.createTable('goal_races', (t) => {
    t.uuid('user_id').primary().references('users.id').onDelete('CASCADE');
    t.text('name').notNullable();
    t.date('date').notNullable();
    t.double('distance_m').notNullable();
    t.double('goal_time_s').notNullable();
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.schema.createTable('race_results', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('name');
    t.date('date').notNullable();
    t.double('distance_m').notNullable();
    t.double('time_s').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['user_id', 'date']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('race_results');
  await knex.schema.dropTable('goal_races');
}
