import { z } from 'zod';
import { ActivityKindSchema } from './activity-kind.ts';
import { DistanceReportSchema, RunListItemSchema } from './schemas.ts';

/** `GET /api/runs` */
export const RunPageSchema = z.object({
  runs: z.array(RunListItemSchema),
  total: z.number(),
  page: z.number(),
  per_page: z.number(),
  /** Pass as `after` for the runs that follow this page (keyset paging); null on the last page. */
  next_cursor: z.string().nullable(),
});
export type RunPage = z.infer<typeof RunPageSchema>;

export const RunSummarySchema = RunListItemSchema.extend({
  time_zone_source: z.enum(['start position', 'profile']),
  distance_source: z.enum(['device', 'geodesic', 'none']),
  pace_s_per_mi: z.number().nullable(),
  descent_m: z.number().nullable(),
  max_hr: z.number().nullable(),
  avg_cad: z.number().nullable(),
  points: z.number(),
  segments: z.number(),
  ended_at: z.string(),
});
export type RunSummary = z.infer<typeof RunSummarySchema>;

/** A split as stored at import (shared/tracks/types.ts `Split`). */
const SplitAnswerSchema = z.object({
  /** 1-based. */
  index: z.number(),
  unit: z.enum(['mi', 'km']),
  distance_m: z.number(),
  /** Start and end, ms since the epoch (end interpolated at exactly k × unit). */
  start_t: z.number(),
  end_t: z.number(),
  elapsed_s: z.number(),
  moving_s: z.number(),
  pace_s: z.number().nullable(),
  flat_pace_s: z.number().nullable(),
  avg_hr: z.number().nullable(),
  max_hr: z.number().nullable(),
  avg_cad: z.number().nullable(),
  elev_gain_m: z.number().nullable(),
  elev_loss_m: z.number().nullable(),
});

/** A lap as the device recorded it (TCX). */
export const RunLapSchema = z.object({
  index: z.number(),
  started_at: z.string(),
  total_time_s: z.number().nullable(),
  distance_m: z.number().nullable(),
  avg_hr: z.number().nullable(),
  max_hr: z.number().nullable(),
});
export type RunLap = z.infer<typeof RunLapSchema>;

export const FastestSectionSchema = z.object({
  distance_m: z.number(),
  time_s: z.number(),
  pace_s_per_km: z.number(),
  started_at: z.string(),
  start_distance_m: z.number(),
});
export type FastestSection = z.infer<typeof FastestSectionSchema>;

export const HeartRateZonesDetailSchema = z.object({
  method: z.enum(['heart-rate reserve', 'percent of maximum']),
  max_hr: z.number(),
  resting_hr: z.number().nullable(),
  /** Zone 0 is "below zone 1"; `to_bpm` null for the top zone. */
  zones: z.array(z.object({ zone: z.number(), from_bpm: z.number(), to_bpm: z.number().nullable() })),
  /** Moving seconds per zone, indexed by zone number. */
  seconds: z.array(z.number()),
});
export type HeartRateZonesDetail = z.infer<typeof HeartRateZonesDetailSchema>;

export const EnergyDetailSchema = z.object({
  gross_kcal: z.number(),
  net_kcal: z.number(),
  weight_kg: z.number(),
  method: z.string(),
});
export type EnergyDetail = z.infer<typeof EnergyDetailSchema>;

/** The run's training load as stored at import (`details.trimp`, shared/weeks/trimp.ts). */
export const TrimpDetailSchema = z.object({
  /** Banister TRIMP, arbitrary units (≈ minutes weighted by intensity). */
  trimp: z.number(),
  minutes: z.number(),
  coefficients: z.enum(['male', 'female']),
  sex_assumed: z.boolean(),
  resting_hr: z.number(),
  max_hr: z.number(),
  method: z.string(),
});
export type TrimpDetail = z.infer<typeof TrimpDetailSchema>;

/** How the track was cleaned at import (shared/tracks/types.ts `CleaningReport`). */
const CleaningReportSchema = z.object({
  input_points: z.number(),
  dropped_untimed: z.number(),
  dropped_backwards: z.number(),
  merged_duplicates: z.number(),
  dropped_no_position: z.number(),
  invalid_positions: z.number(),
});

/** `GET /api/runs/:id` */
export const RunDetailSchema = z.object({
  id: z.string(),
  owner_id: z.string(),
  /** The owner's profile zone (IANA): the run's notes and check-in are shown in it. The start is in `summary.time_zone`. */
  owner_time_zone: z.string(),
  name: z.string(),
  sport: z.string().nullable(),
  /** Run, ride or hike (issue #14). */
  kind: ActivityKindSchema,
  summary: RunSummarySchema,
  splits: z.object({ mi: z.array(SplitAnswerSchema), km: z.array(SplitAnswerSchema) }),
  laps: z.array(RunLapSchema),
  fastest_sections: z.array(FastestSectionSchema),
  details: z.object({
    cleaning: CleaningReportSchema,
    format: z.string(),
    hr_zones: HeartRateZonesDetailSchema.nullable(),
    energy: EnergyDetailSchema.nullable(),
    /** Banister TRIMP with the profile values it used; null without heart rate, resting and maximum heart rate. */
    trimp: TrimpDetailSchema.nullable().optional(),
    /** Absent on runs imported before issue #14. */
    distance: DistanceReportSchema.nullable().optional(),
  }),
});
export type RunDetail = z.infer<typeof RunDetailSchema>;

const SeriesSchema = z.array(z.number().nullable());
/** `GET /api/runs/:id/track`: columns thinned to at most 2000 points, nulls where unknown. */
export const RunTrackSchema = z.object({
  points: z.number(),
  step: z.number(),
  t: SeriesSchema,
  d: SeriesSchema,
  lat: SeriesSchema,
  lon: SeriesSchema,
  ele: SeriesSchema.nullable(),
  hr: SeriesSchema.nullable(),
});
export type RunTrack = z.infer<typeof RunTrackSchema>;
