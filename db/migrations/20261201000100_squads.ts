import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('squads', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('coach_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('name').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['coach_id']);
  });
  await knex.schema.createTable('squad_members', (t) => {
    t.uuid('squad_id').notNullable().references('squads.id').onDelete('CASCADE');
    t.uuid('runner_id').notNullable().references('users.id').onDelete('CASCADE');
    t.timestamp('joined_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['squad_id', 'runner_id']);
    t.index(['runner_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('squad_members');
  await knex.schema.dropTable('squads');
}
