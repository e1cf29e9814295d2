import { computeFastestSections } from './fastest.ts';
import { buildSeries } from './series.ts';
import { computeSplits } from './splits.ts';
import { summarizeRun } from './summary.ts';
import type { CleanTrack, FastestSection, RunSummary, Split, TrackSeries } from './types.ts';

/** Everything computed for one run. */
export interface RunAnalysis {
  series: TrackSeries;
  summary: RunSummary;
  splits: { mi: Split[]; km: Split[] };
  fastest: FastestSection[];
}

/**
 * Compute a run from its cleaned track: series, summary, splits in both units and fastest
 * sections. Needs at least one point; with one point everything is zero and there are no splits.
 * `seriesReady` is told the series as soon as it is built, before the rest is computed from it (an
 * import hands the track's columns to be stored meanwhile: server/features/runs/README.md); it must
 * not change the series.
 */
export function analyseTrack(track: CleanTrack, seriesReady?: (series: TrackSeries) => void): RunAnalysis {
  const series = buildSeries(track);
  seriesReady?.(series);
  return {
    series,
    summary: summarizeRun(series, track.segment_starts.length),
    splits: { mi: computeSplits(series, 'mi'), km: computeSplits(series, 'km') },
    fastest: computeFastestSections(series),
  };
}
