/** Measures a generated track through the real import path (GPX text → parser → analysis) against its truth. */
import { parseTrackFile } from '../../server/features/runs/parse/parse-track-file.ts';
import { analyseTrack } from '../../shared/tracks/analyse.ts';
import type { SplitUnit } from '../../shared/tracks/types.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { generateGpsTrack, gpsTrueDistance, gpsTrueFullSplits, type GpsTrackOptions } from './gps-tracks.ts';
import { wanderBoundaryShifts, wanderLengthChange } from './gps-wander-floor.ts';

/** See `nearStanding` in `measureTrack`. */
export const STANDING_MARGIN_M = 25;

export interface TrackErrors {
  /** Largest |elapsed − truth| and |moving − truth| over every full mile and km split, s. */
  worst_elapsed_s: number;
  worst_moving_s: number;
  /** Measured total over the recordable true distance, minus one. */
  total_error: number;
  raw_error: number;
  smoothed: boolean;
  full_splits: number;
  /**
   * The same worsts for the wander alone (`gps-wander-floor.ts`): what the slow wander leaves in the
   * same judged splits for any position-only method.
   */
  floor_elapsed_s: number;
  floor_moving_s: number;
  /** The wander's own change of the whole length (first order), over the recordable true distance. */
  floor_total: number;
  /** Every judged split: its errors (NaN where not judged), its wander floor and the events in it. */
  splits: SplitCheck[];
}

export interface SplitCheck {
  unit: SplitUnit;
  index: number;
  elapsed_error_s: number;
  moving_error_s: number;
  floor_s: number;
  /** Stops, auto-pauses and recording gaps inside the split or within `STANDING_MARGIN_M` of its ends. */
  events: number;
}

export function measureTrack(options: GpsTrackOptions): TrackErrors {
  const track = generateGpsTrack(options);
  const [run] = parseTrackFile(Buffer.from(writeGpx('generated', track.segments)));
  const analysis = analyseTrack(run!.track);
  const truthDistance = gpsTrueDistance(track.recordable.phases);
  // Where the runner stood still (stops, auto-pauses), m from the start.
  const standing: number[] = [];
  // Where each stop, pause or gap starts and ends, m from the start.
  const events: Array<[number, number]> = [];
  let covered = 0;
  for (const phase of track.recordable.phases) {
    const from = covered;
    if (phase.kind === 'stop' || phase.kind === 'pause') standing.push(covered);
    else covered += phase.speed_mps * phase.duration_s;
    if (phase.kind !== 'run') events.push([from, covered]);
  }
  const splits: SplitCheck[] = [];
  let worstElapsed = 0;
  let worstMoving = 0;
  let floorElapsed = 0;
  let floorMoving = 0;
  let count = 0;
  for (const unit of ['km', 'mi'] as SplitUnit[]) {
    const truth = gpsTrueFullSplits(track.recordable, unit);
    const shifts = wanderBoundaryShifts(track.recordable, track.errors, unit);
    const measured = analysis.splits[unit];
    const unitM = unit === 'km' ? 1000 : 1609.344;
    // A boundary within this distance of a place the runner stood at may fall either side of the
    // standing time: a metre's error moves it by the whole stop. Elapsed time is not judged there.
    const nearStanding = (k: number): boolean => standing.some((at) => Math.abs(at - k * unitM) < STANDING_MARGIN_M);
    truth.forEach((expected, k) => {
      const split = measured[k];
      // The last full split of the truth may be missing when the measured total falls a little
      // short of it; the total's own check covers that. Any other missing split is an infinite error.
      const lastTruth = k === truth.length - 1;
      const full = split !== undefined && split.distance_m === unitM;
      if (!full && lastTruth) return;
      const floor = Math.abs(shifts[k]! - shifts[k + 1]!);
      const judged = !nearStanding(k) && !nearStanding(k + 1);
      splits.push({
        unit,
        index: k,
        elapsed_error_s: !full ? Infinity : judged ? split.elapsed_s - expected.elapsed_s : Number.NaN,
        moving_error_s: full ? split.moving_s - expected.moving_s : Infinity,
        floor_s: floor,
        events: events.filter(([a, b]) => b > k * unitM - STANDING_MARGIN_M && a < (k + 1) * unitM + STANDING_MARGIN_M).length,
      });
      if (judged) {
        worstElapsed = Math.max(worstElapsed, full ? Math.abs(split.elapsed_s - expected.elapsed_s) : Infinity);
        floorElapsed = Math.max(floorElapsed, floor);
      }
      worstMoving = Math.max(worstMoving, full ? Math.abs(split.moving_s - expected.moving_s) : Infinity);
      floorMoving = Math.max(floorMoving, floor);
      count++;
    });
  }
  const report = analysis.summary.distance_report;
  return {
    worst_elapsed_s: worstElapsed,
    worst_moving_s: worstMoving,
    total_error: analysis.summary.distance_m / truthDistance - 1,
    raw_error: report.raw_distance_m / truthDistance - 1,
    smoothed: report.smoothed,
    full_splits: count,
    floor_elapsed_s: floorElapsed,
    floor_moving_s: floorMoving,
    floor_total: (wanderLengthChange(track.errors).at(-1) ?? 0) / truthDistance,
    splits,
  };
}
