import type { Knex } from 'knex';

/** Issue 15: who changed a session and when, the session library, write batches (undo), day marks, calendar feeds. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('session_plans', (t) => {
    // The last person who changed the session (the author until someone edits it).
    t.uuid('updated_by').references('users.id').onDelete('SET NULL');
    // Bumped on every change: the calendar feed's SEQUENCE.
    t.integer('sequence').notNullable().defaultTo(0);
  });
  await knex.raw('update session_plans set updated_by = author_id');

  // Every change to a session by either side. No foreign key to the plan: a deletion stays recorded.
  await knex.schema.createTable('plan_changes', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('plan_id').notNullable();
    t.uuid('runner_id').notNullable().references('users.id').onDelete('CASCADE');
    t.uuid('actor_id').references('users.id').onDelete('SET NULL');
    t.text('actor_name').notNullable();
    t.text('kind').notNullable();
    t.text('summary').notNullable();
    t.date('plan_date').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    // Set once the runner has been told about it by e-mail (a coach's change), or when no notice is due.
    t.timestamp('noticed_at', { useTz: true });
    t.index(['plan_id', 'created_at']);
    t.index(['runner_id', 'noticed_at']);
  });

  await knex.schema.createTable('library_sessions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('owner_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('name').notNullable();
    t.text('title').notNullable().defaultTo('');
    t.text('notes').notNullable().defaultTo('');
    t.jsonb('items').notNullable();
    // The fuel plan's inputs (body mass, pace, intakes…) copied onto each session it is applied to.
    t.jsonb('fuel_plan');
    t.timestamps(true, true);
  });
  await knex.raw('create unique index library_sessions_owner_name_unique on library_sessions (owner_id, lower(name))');

  // One multi-session write (copy a week, apply a library session), kept so it can be undone.
  await knex.schema.createTable('plan_batches', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('actor_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('kind').notNullable();
    t.jsonb('created_ids').notNullable();
    // The sessions a "replace" removed, whole (with their fuel plans), to put back on undo.
    t.jsonb('replaced').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable('day_marks', (t) => {
    t.uuid('runner_id').notNullable().references('users.id').onDelete('CASCADE');
    t.date('date').notNullable();
    t.text('kind').notNullable();
    t.integer('minutes');
    t.text('note').notNullable().defaultTo('');
    t.uuid('author_id').references('users.id').onDelete('SET NULL');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['runner_id', 'date']);
  });

  await knex.schema.createTable('calendar_feeds', (t) => {
    t.uuid('user_id').primary().references('users.id').onDelete('CASCADE');
    t.text('token_hash').notNullable().unique();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.alterTable('users', (t) => {
    t.boolean('notify_on_plan_change').notNullable().defaultTo(true);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => t.dropColumn('notify_on_plan_change'));
  await knex.schema.dropTable('calendar_feeds');
  await knex.schema.dropTable('day_marks');
  await knex.schema.dropTable('plan_batches');
  await knex.schema.dropTable('library_sessions');
  await knex.schema.dropTable('plan_changes');
  await knex.schema.alterTable('session_plans', (t) => {
    t.dropColumn('sequence');
    t.dropColumn('updated_by');
  });
}
