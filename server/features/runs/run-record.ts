import tzLookup from '@photostructure/tz-lookup';
import { activityKindOf } from '../../../shared/runs/activity-kind.ts';
import { localDateTime } from '../../../shared/runs/local-time.ts';
import { DistanceReportSchema } from '../../../shared/runs/schemas.ts';
import type { RunAnalysis } from '../../../shared/tracks/analyse.ts';
import { estimateRunEnergy } from '../../../shared/tracks/energy.ts';
import { heartRateZones, timeInZones } from '../../../shared/tracks/heart-rate.ts';
import { seriesPositions } from '../../../shared/tracks/series.ts';
import type { Split } from '../../../shared/tracks/types.ts';
import { trimpOfSeries } from '../../../shared/weeks/trimp.ts';
import { canonicalTimeZone } from '../../../shared/users/time-zones.ts';
import type { RunRow, RunSplitRow, UserRow } from '../../lib/db.ts';
import type { ParsedRun } from './parse/parse-track-file.ts';
import type { RunChildren } from './runs.repository.ts';
import { packColumns, type TrackLayout } from './track-blob.ts';

/** The profile fields an import reads (heart rates, weight, sex, time zone), sent to the compute workers. */
export type RunOwnerProfile = Pick<UserRow, 'id' | 'time_zone' | 'max_hr' | 'resting_hr' | 'weight_kg' | 'sex'>;

export function runOwnerProfile(user: UserRow): RunOwnerProfile {
  const { id, time_zone, max_hr, resting_hr, weight_kg, sex } = user;
  return { id, time_zone, max_hr, resting_hr, weight_kg, sex };
}

/** Time zone of the run's first position (tz-lookup), else the runner's profile time zone. */
function timeZoneOf(parsed: ParsedRun, fallback: string): { zone: string; source: 'start position' | 'profile' } {
  const { lat, lon, length } = parsed.track.columns;
  let first = 0;
  while (first < length && Number.isNaN(lat[first])) first++;
  if (first < length) {
    try {
      const zone = tzLookup(lat[first]!, lon[first]!);
      // Open sea answers a nautical Etc/GMT±N zone; the runner's own zone is a better guess there.
      // Stored under its current IANA name, like the profile's (issue 17).
      if (!zone.startsWith('Etc/')) return { zone: canonicalTimeZone(zone) ?? zone, source: 'start position' };
    } catch {
      // Out-of-range positions were already dropped; keep the profile zone if the lookup still fails.
    }
  }
  return { zone: fallback, source: 'profile' };
}

/**
 * Figures that depend on the profile at import time (heart rates, weight): time in heart-rate zones
 * and the ACSM energy estimate. Stored with the inputs used, so the run page can say what they came from.
 */
function profileDependentFigures(user: RunOwnerProfile, analysis: RunAnalysis) {
  const { series, summary } = analysis;
  const zones = heartRateZones(user.max_hr, user.resting_hr);
  const energy = estimateRunEnergy(summary.distance_m, summary.moving_s, user.weight_kg);
  const trimp =
    series.hr && user.resting_hr !== null && user.max_hr !== null
      ? trimpOfSeries(series.t, series.hr, series.moving, user.resting_hr, user.max_hr, user.sex)
      : null;
  return {
    trimp: trimp
      ? {
          ...trimp,
          resting_hr: user.resting_hr,
          max_hr: user.max_hr,
          method: 'Banister TRIMP, summed interval by interval over moving time',
        }
      : null,
    hr_zones:
      zones && series.hr
        ? {
            method: zones.method,
            max_hr: user.max_hr,
            resting_hr: user.resting_hr,
            zones: zones.zones,
            seconds: timeInZones(series.t, series.hr, series.moving, zones.zones),
          }
        : null,
    energy: energy ? { ...energy, weight_kg: user.weight_kg, method: 'ACSM running equation, level, 5 kcal per litre O2' } : null,
  };
}

/** A run's stored series (run_tracks): its columns packed in `data_layout`, not yet compressed (track-blob.ts). */
export interface StoredTrack {
  columns: string[];
  point_count: number;
  data_layout: TrackLayout;
  raw: Uint8Array;
  /** The bytes went to the event loop ahead of the rest (runs.service.ts puts them back): `raw` is empty here. */
  handed_over?: true;
}

/** The columns a run's track is stored with, from its series: time, distance, position, then what the file had. */
export function packedTrack(parsed: ParsedRun, series: RunAnalysis['series']): StoredTrack {
  const { lat, lon } = seriesPositions(parsed.track, series);
  const columns: Record<string, Float64Array> = { t: series.t, d: series.d, lat, lon };
  if (series.ele_smooth) columns.ele = series.ele_smooth;
  if (series.hr) columns.hr = series.hr;
  if (series.cad) columns.cad = series.cad;
  columns.moving = Float64Array.from(series.moving);
  const packed = packColumns(columns);
  return { columns: packed.columns, point_count: packed.pointCount, data_layout: packed.layout, raw: packed.raw };
}

/** The record's stand-in for a track whose bytes were handed over already: its names and count, no bytes. */
function handedOverTrack(track: StoredTrack): StoredTrack {
  const { columns, point_count, data_layout } = track;
  return { columns, point_count, data_layout, raw: new Uint8Array(0), handed_over: true };
}

/**
 * A run as it is about to be stored: its row (without the source file it came from) and its children, the
 * track's columns packed but not yet compressed (track-blob.ts).
 */
export interface RunRecord {
  run: Omit<RunRow, 'id' | 'created_at' | 'source_file_id'>;
  children: Omit<RunChildren, 'track'> & { track: StoredTrack };
}

/**
 * The rows of one parsed and analysed run. Pure computation (no database, no files), so it runs in
 * the compute workers (server/features/compute); `user` is only the profile fields it reads.
 */
export function buildRunRecord(
  user: RunOwnerProfile,
  parsed: ParsedRun,
  analysis: RunAnalysis,
  handedOver?: StoredTrack,
): RunRecord {
  const { summary, series } = analysis;
  const tz = timeZoneOf(parsed, user.time_zone);
  const local = localDateTime(summary.started_at_t, tz.zone);
  const run: RunRecord['run'] = {
    user_id: user.id,
    activity_index: parsed.activity_index,
    name: parsed.name?.trim().slice(0, 120) || `Run ${local.date} ${local.time}`,
    sport: parsed.sport,
    activity_kind: activityKindOf(parsed.sport, summary),
    started_at: new Date(summary.started_at_t),
    ended_at: new Date(summary.ended_at_t),
    local_date: local.date,
    local_time: local.time,
    time_zone: tz.zone,
    time_zone_source: tz.source,
    distance_m: summary.distance_m,
    distance_source: summary.distance_source,
    elapsed_s: summary.elapsed_s,
    moving_s: summary.moving_s,
    ascent_m: summary.ascent_m,
    descent_m: summary.descent_m,
    avg_hr: summary.avg_hr,
    max_hr: summary.max_hr,
    avg_cad: summary.avg_cad,
    points: summary.points,
    segments: summary.segments,
    details: {
      cleaning: parsed.track.report,
      format: parsed.format,
      distance: DistanceReportSchema.parse(summary.distance_report),
      ...profileDependentFigures(user, analysis),
    },
  };
  // Packed, not yet compressed: the gzip runs beside the run's first statements (runs.service.ts), unless the
  // compute thread handed the track over already, as soon as the series was built (import-compute.ts).
  const track = handedOver ? handedOverTrack(handedOver) : packedTrack(parsed, series);
  const toSplitRow = (s: Split): Omit<RunSplitRow, 'run_id'> => ({
    unit: s.unit,
    split_index: s.index,
    distance_m: s.distance_m,
    start_at: new Date(s.start_t),
    end_at: new Date(s.end_t),
    elapsed_s: s.elapsed_s,
    moving_s: s.moving_s,
    pace_s: s.pace_s,
    flat_pace_s: s.flat_pace_s,
    avg_hr: s.avg_hr,
    max_hr: s.max_hr,
    avg_cad: s.avg_cad,
    elev_gain_m: s.elev_gain_m,
    elev_loss_m: s.elev_loss_m,
  });
  return {
    run,
    children: {
      track,
      splits: [...analysis.splits.mi, ...analysis.splits.km].map(toSplitRow),
      laps: parsed.laps.map((l, i) => ({
        lap_index: i + 1,
        start_at: new Date(l.start_t),
        total_time_s: l.total_time_s,
        distance_m: l.distance_m,
        avg_hr: l.avg_hr,
        max_hr: l.max_hr,
      })),
      fastest: analysis.fastest.map((f) => ({
        distance_m: f.distance_m,
        time_s: f.time_s,
        pace_s_per_km: f.pace_s_per_km,
        start_at: new Date(f.start_t),
        end_at: new Date(f.end_t),
        start_distance_m: f.start_distance_m,
      })),
    },
  };
}
