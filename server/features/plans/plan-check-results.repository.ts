import { db, type Db, type PlanCheckResultRow, readDb } from '../../lib/db.ts';

export async function findPlanCheckResults(runIds: readonly string[], trx: Db = readDb()): Promise<PlanCheckResultRow[]> {
  if (runIds.length === 0) return [];
  return trx('plan_check_results').whereIn('run_id', runIds);
}

/** Stores (or replaces) the results of runs' plan checks, each with the key of the inputs it was computed from. */
export async function savePlanCheckResults(
  rows: ReadonlyArray<{ run_id: string; inputs_key: string; result: unknown }>,
  trx: Db = db,
): Promise<void> {
  if (rows.length === 0) return;
  await trx('plan_check_results')
    .insert(
      rows.map((r) => ({
        run_id: r.run_id,
        inputs_key: r.inputs_key,
        result: JSON.stringify(r.result),
        computed_at: new Date(),
      })),
    )
    .onConflict('run_id')
    .merge();
}
