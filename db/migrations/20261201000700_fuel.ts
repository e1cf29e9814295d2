import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // Each user's own list of fuel items; amounts are per serving.
  await knex.schema.createTable('fuel_items', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('name').notNullable();
    t.text('serving').notNullable().defaultTo('');
    t.double('carbohydrate_g').notNullable();
    t.double('sodium_mg').notNullable();
    t.double('caffeine_mg').notNullable();
    t.double('fluid_ml').notNullable();
    t.timestamps(true, true);
    t.index(['user_id']);
  });
  await knex.raw(
    'alter table fuel_items add constraint fuel_items_amounts_check check (carbohydrate_g >= 0 and sodium_mg >= 0 and caffeine_mg between 0 and 400 and fluid_ml >= 0)',
  );

  // A fuel plan belongs to exactly one session plan or to the runner's goal race (goal_races is keyed by user).
  await knex.schema.createTable('fuel_plans', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('runner_id').notNullable().references('users.id').onDelete('CASCADE');
    t.uuid('author_id').references('users.id').onDelete('SET NULL');
    t.uuid('plan_id').unique().references('session_plans.id').onDelete('CASCADE');
    t.uuid('goal_race_user_id').unique().references('goal_races.user_id').onDelete('CASCADE');
    t.double('body_mass_kg').notNullable();
    t.double('expected_duration_s').notNullable();
    // True when the runner or coach gave the duration; false when it came from the plan's paces or the goal time.
    t.boolean('expected_duration_given').notNullable().defaultTo(false);
    t.double('easy_pace_s_per_km');
    t.text('start_clock');
    t.double('sweat_l_per_h');
    // The targets in force ({carbohydrate, fluid, sodium}, each {low, high, unit, source, note, evidence}).
    t.jsonb('targets').notNullable();
    // {rules, bottles} as written.
    t.jsonb('intakes').notNullable();
    // The computed schedule, the course it was placed on and the item facts it used (a snapshot).
    t.jsonb('schedule').notNullable();
    t.timestamps(true, true);
  });
  await knex.raw(
    'alter table fuel_plans add constraint fuel_plans_owner_check check (num_nonnulls(plan_id, goal_race_user_id) = 1)',
  );

  await knex.schema.createTable('fuel_taken', (t) => {
    t.uuid('run_id').primary().references('runs.id').onDelete('CASCADE');
    // [{kind, item_id, name, servings, time_s, carbohydrate_g, fluid_ml, sodium_mg, caffeine_mg}], amounts as taken.
    t.jsonb('entries').notNullable();
    t.smallint('stomach');
    t.smallint('energy');
    t.text('notes').notNullable().defaultTo('');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(
    'alter table fuel_taken add constraint fuel_taken_scales_check check (stomach between 1 and 5 and energy between 1 and 5)',
  );

  await knex.schema.createTable('run_checkins', (t) => {
    t.uuid('run_id').primary().references('runs.id').onDelete('CASCADE');
    t.double('sleep_hours');
    t.smallint('soreness');
    t.smallint('mood');
    t.double('walking_minutes');
    t.double('mobility_minutes');
    t.double('cold_water_temp_c');
    t.double('cold_water_minutes');
    t.text('notes').notNullable().defaultTo('');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(
    `alter table run_checkins add constraint run_checkins_values_check check (
      soreness between 1 and 5 and mood between 1 and 5 and sleep_hours between 0 and 24
      and cold_water_temp_c between 0 and 30 and cold_water_minutes between 0 and 60
      and (cold_water_temp_c is null) = (cold_water_minutes is null))`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('run_checkins');
  await knex.schema.dropTable('fuel_taken');
  await knex.schema.dropTable('fuel_plans');
  await knex.schema.dropTable('fuel_items');
}
