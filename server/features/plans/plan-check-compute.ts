import { checkRunAgainstPlan, type CheckLap, type CheckedPart, type PlanCheckResult } from '../../../shared/plans/plan-check.ts';
import { isDatabaseUnavailable } from '../../lib/database-errors.ts';
import { workerDatabase } from '../compute/worker.ts';
import { decodeColumns, type TrackLayout } from '../runs/worker.ts';

/** What one plan check needs: the resolved parts, where the run's stored track is, and its device laps. */
export interface PlanCheckComputeInput {
  parts: CheckedPart[];
  runId: string;
  /** The worker reads the track blob itself (server/features/compute/worker-db.ts). */
  databaseUrl: string;
  laps: CheckLap[];
  tolerance: number;
}

export type PlanCheckComputeOutput =
  | { ok: true; result: PlanCheckResult }
  | { ok: false; reason: 'no-track' }
  /** An error's code does not survive the trip between threads, so "the database is away" is said here. */
  | { ok: false; reason: 'database-unavailable' };

/** Reads and decodes the run's stored series and compares it with the plan; runs in a compute worker. */
export async function computePlanCheck(input: PlanCheckComputeInput): Promise<PlanCheckComputeOutput> {
  let row: { columns: string[]; point_count: number; data: Buffer; data_layout: TrackLayout } | undefined;
  try {
    const found = await workerDatabase(input.databaseUrl).query<NonNullable<typeof row>>(
      'select columns, point_count, data, data_layout from run_tracks where run_id = $1',
      [input.runId],
    );
    row = found.rows[0];
  } catch (err) {
    if (isDatabaseUnavailable(err)) return { ok: false, reason: 'database-unavailable' };
    throw err;
  }
  if (!row) return { ok: false, reason: 'no-track' };
  const columns = decodeColumns(row.columns, row.point_count, row.data, row.data_layout);
  const result = checkRunAgainstPlan(
    input.parts,
    { t: columns.t!, d: columns.d!, hr: columns.hr ?? null, moving: columns.moving ?? null },
    input.laps,
    input.tolerance,
  );
  return { ok: true, result };
}
