import type { Knex } from 'knex';

/**
 * Stored plan-check results, one per run: the week review and the squad overview read a verdict
 * instead of decoding the run's track again. `inputs_key` is a hash of everything the check read
 * (the run, the plan's resolved parts, the tolerance, the check's version); a row whose key no longer
 * matches is recomputed on the next read, so nothing has to remember to delete it.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('plan_check_results', (t) => {
    t.uuid('run_id').primary().references('runs.id').onDelete('CASCADE');
    t.text('inputs_key').notNullable();
    t.jsonb('result').notNullable();
    t.timestamp('computed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('plan_check_results');
}
