import { db, type Db, type FuelItemRow, type FuelPlanRow, type FuelTakenRow, type RunCheckinRow, readDb } from '../../lib/db.ts';
import { bumpWeekInputs, bumpWeekInputsOfRuns } from '../week-cache/index.ts';
import type { FuelItem, FuelItemInput, FuelItemPatch } from '../../../shared/fuel/schemas.ts';
import type { FuelTargets } from '../../../shared/fuel/targets.ts';
import type { TakenEntry } from '../../../shared/fuel/taken.ts';

export function toFuelItem(row: FuelItemRow): FuelItem {
  return {
    id: row.id,
    name: row.name,
    serving: row.serving,
    carbohydrate_g: row.carbohydrate_g,
    sodium_mg: row.sodium_mg,
    caffeine_mg: row.caffeine_mg,
    fluid_ml: row.fluid_ml,
  };
}

export async function listFuelItems(userId: string, trx: Db = db): Promise<FuelItemRow[]> {
  return trx('fuel_items')
    .where({ user_id: userId })
    .orderBy([{ column: 'name' }, { column: 'created_at' }]);
}

export async function findFuelItemsByIds(userId: string, ids: readonly string[], trx: Db = db): Promise<FuelItemRow[]> {
  if (ids.length === 0) return [];
  return trx('fuel_items')
    .where({ user_id: userId })
    .whereIn('id', [...ids]);
}

export async function insertFuelItem(userId: string, item: FuelItemInput, trx: Db = db): Promise<FuelItemRow> {
  const [row] = await trx('fuel_items')
    .insert({ user_id: userId, ...item })
    .returning('*');
  return row as FuelItemRow;
}

/** Changes one of the user's items; undefined when they have no such item. */
export async function updateFuelItem(userId: string, id: string, patch: FuelItemPatch, trx: Db = db) {
  const [row] = await trx('fuel_items')
    .where({ user_id: userId, id })
    .update({ ...patch, updated_at: new Date() })
    .returning('*');
  return row as FuelItemRow | undefined;
}

export async function deleteFuelItem(userId: string, id: string, trx: Db = db): Promise<boolean> {
  return (await trx('fuel_items').where({ user_id: userId, id }).delete()) > 0;
}

/** Where a fuel plan belongs: a session plan, or the runner's goal race. */
export type FuelPlanOwner = { plan_id: string } | { goal_race_user_id: string };

export async function findFuelPlan(owner: FuelPlanOwner, trx: Db = db): Promise<FuelPlanRow | undefined> {
  return trx('fuel_plans').where(owner).first();
}

export interface FuelPlanValues {
  runner_id: string;
  author_id: string;
  body_mass_kg: number;
  expected_duration_s: number;
  expected_duration_given: boolean;
  easy_pace_s_per_km: number | null;
  start_clock: string | null;
  sweat_l_per_h: number | null;
  targets: FuelTargets;
  intakes: unknown;
  schedule: unknown;
}

export async function upsertFuelPlan(owner: FuelPlanOwner, values: FuelPlanValues, trx: Db = db): Promise<FuelPlanRow> {
  const conflict = 'plan_id' in owner ? 'plan_id' : 'goal_race_user_id';
  const [row] = await trx('fuel_plans')
    .insert({
      ...owner,
      ...values,
      targets: JSON.stringify(values.targets),
      intakes: JSON.stringify(values.intakes),
      schedule: JSON.stringify(values.schedule),
      updated_at: new Date(),
    })
    .onConflict(conflict)
    .merge()
    .returning('*');
  await bumpWeekInputs([(row as FuelPlanRow).runner_id], trx);
  return row as FuelPlanRow;
}

export async function deleteFuelPlan(owner: FuelPlanOwner, trx: Db = db): Promise<boolean> {
  const gone: Array<{ runner_id: string }> = await trx('fuel_plans').where(owner).delete().returning('runner_id');
  await bumpWeekInputs(
    gone.map((r) => r.runner_id),
    trx,
  );
  return gone.length > 0;
}

export async function findFuelTaken(runId: string, trx: Db = db): Promise<FuelTakenRow | undefined> {
  return trx('fuel_taken').where({ run_id: runId }).first();
}

export async function findFuelTakenOf(runIds: readonly string[], trx: Db = readDb()): Promise<FuelTakenRow[]> {
  if (runIds.length === 0) return [];
  return trx('fuel_taken').whereIn('run_id', runIds);
}

export async function upsertFuelTaken(
  runId: string,
  values: { entries: TakenEntry[]; stomach: number | null; energy: number | null; notes: string },
  trx: Db = db,
): Promise<FuelTakenRow> {
  const [row] = await trx('fuel_taken')
    .insert({ run_id: runId, ...values, entries: JSON.stringify(values.entries), updated_at: new Date() })
    .onConflict('run_id')
    .merge()
    .returning('*');
  await bumpWeekInputsOfRuns([runId], trx);
  return row as FuelTakenRow;
}

export async function findRunCheckin(runId: string, trx: Db = db): Promise<RunCheckinRow | undefined> {
  return trx('run_checkins').where({ run_id: runId }).first();
}

export async function findRunCheckinsOf(runIds: readonly string[], trx: Db = readDb()): Promise<RunCheckinRow[]> {
  if (runIds.length === 0) return [];
  return trx('run_checkins').whereIn('run_id', runIds);
}

export async function upsertRunCheckin(values: Omit<RunCheckinRow, 'updated_at'>, trx: Db = db): Promise<RunCheckinRow> {
  const [row] = await trx('run_checkins')
    .insert({ ...values, updated_at: new Date() })
    .onConflict('run_id')
    .merge()
    .returning('*');
  await bumpWeekInputsOfRuns([values.run_id], trx);
  return row as RunCheckinRow;
}
