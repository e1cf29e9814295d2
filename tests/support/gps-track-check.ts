/** Measures a generated track through the real import path (GPX text → parser → analysis) against its truth. */
import { parseTrackFile } from '../../server/features/runs/parse/parse-track-file.ts';
import { analyseTrack } from '../../shared/tracks/analyse.ts';
import type { SplitUnit } from '../../shared/tracks/types.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { generateGpsTrack, gpsTrueDistance, gpsTrueFullSplits, type GpsTrackOptions } from './gps-tracks.ts';

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
}

export function measureTrack(options: GpsTrackOptions): TrackErrors {
  const track = generateGpsTrack(options);
  const [run] = parseTrackFile(Buffer.from(writeGpx('generated', track.segments)));
  const analysis = analyseTrack(run!.track);
  const truthDistance = gpsTrueDistance(track.recordable.phases);
  // Where the runner stood still (stops, auto-pauses), m from the start.
  const standing: number[] = [];
  let covered = 0;
  for (const phase of track.recordable.phases) {
    if (phase.kind === 'stop' || phase.kind === 'pause') standing.push(covered);
    else covered += phase.speed_mps * phase.duration_s;
  }
  let worstElapsed = 0;
  let worstMoving = 0;
  let count = 0;
  for (const unit of ['km', 'mi'] as SplitUnit[]) {
    const truth = gpsTrueFullSplits(track.recordable, unit);
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
      if (!nearStanding(k) && !nearStanding(k + 1)) {
        worstElapsed = Math.max(worstElapsed, full ? Math.abs(split.elapsed_s - expected.elapsed_s) : Infinity);
      }
      worstMoving = Math.max(worstMoving, full ? Math.abs(split.moving_s - expected.moving_s) : Infinity);
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
  };
}
