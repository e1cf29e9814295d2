import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // One uploaded file, kept byte for byte in storage; a TCX file may hold several runs.
  await knex.schema.createTable('source_files', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('original_name').notNullable();
    t.text('sha256').notNullable();
    t.bigInteger('size_bytes').notNullable();
    t.text('storage_key').notNullable();
    t.text('format').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['user_id', 'sha256']);
  });

  await knex.schema.createTable('runs', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.uuid('source_file_id').notNullable().references('source_files.id').onDelete('CASCADE');
    t.integer('activity_index').notNullable().defaultTo(0);
    t.text('name').notNullable();
    t.text('sport');
    t.timestamp('started_at', { useTz: true }).notNullable();
    t.timestamp('ended_at', { useTz: true }).notNullable();
    t.date('local_date').notNullable();
    t.text('local_time').notNullable();
    t.text('time_zone').notNullable();
    t.text('time_zone_source').notNullable();
    t.double('distance_m').notNullable();
    t.text('distance_source').notNullable();
    t.double('elapsed_s').notNullable();
    t.double('moving_s').notNullable();
    t.double('ascent_m');
    t.double('descent_m');
    t.double('avg_hr');
    t.double('max_hr');
    t.double('avg_cad');
    t.integer('points').notNullable();
    t.integer('segments').notNullable();
    t.jsonb('details').notNullable(); // cleaning report, HR zones, energy estimate: shown as computed
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['user_id', 'started_at']);
    t.index(['user_id', 'local_date']);
  });

  // The cleaned series as columnar Float64 arrays in one compressed blob per run (not a row per point).
  await knex.schema.createTable('run_tracks', (t) => {
    t.uuid('run_id').primary().references('runs.id').onDelete('CASCADE');
    t.integer('point_count').notNullable();
    t.specificType('columns', 'text[]').notNullable();
    t.binary('data').notNullable();
  });

  await knex.schema.createTable('run_splits', (t) => {
    t.uuid('run_id').notNullable().references('runs.id').onDelete('CASCADE');
    t.text('unit').notNullable();
    t.integer('split_index').notNullable();
    t.double('distance_m').notNullable();
    t.timestamp('start_at', { useTz: true, precision: 3 }).notNullable();
    t.timestamp('end_at', { useTz: true, precision: 3 }).notNullable();
    t.double('elapsed_s').notNullable();
    t.double('moving_s').notNullable();
    t.double('pace_s');
    t.double('flat_pace_s');
    t.double('avg_hr');
    t.double('max_hr');
    t.double('avg_cad');
    t.double('elev_gain_m');
    t.double('elev_loss_m');
    t.primary(['run_id', 'unit', 'split_index']);
  });

  await knex.schema.createTable('run_laps', (t) => {
    t.uuid('run_id').notNullable().references('runs.id').onDelete('CASCADE');
    t.integer('lap_index').notNullable();
    t.timestamp('start_at', { useTz: true, precision: 3 }).notNullable();
    t.double('total_time_s');
    t.double('distance_m');
    t.double('avg_hr');
    t.double('max_hr');
    t.primary(['run_id', 'lap_index']);
  });

  await knex.schema.createTable('run_fastest_sections', (t) => {
    t.uuid('run_id').notNullable().references('runs.id').onDelete('CASCADE');
    t.double('distance_m').notNullable();
    t.double('time_s').notNullable();
    t.double('pace_s_per_km').notNullable();
    t.timestamp('start_at', { useTz: true, precision: 3 }).notNullable();
    t.timestamp('end_at', { useTz: true, precision: 3 }).notNullable();
    t.double('start_distance_m').notNullable();
    t.primary(['run_id', 'distance_m']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['run_fastest_sections', 'run_laps', 'run_splits', 'run_tracks', 'runs', 'source_files']) {
    await knex.schema.dropTable(table);
  }
}
