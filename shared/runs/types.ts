import type { CleaningReport, Split } from '../tracks/types.ts';
import type { ActivityKind } from './activity-kind.ts';
import type { TrimpResult } from '../weeks/trimp.ts';
import type { DistanceReportAnswer, RunListItem } from './schemas.ts';

/** `GET /api/runs` */
export interface RunPage {
  runs: RunListItem[];
  total: number;
  page: number;
  per_page: number;
}

export interface RunSummary extends RunListItem {
  time_zone_source: 'start position' | 'profile';
  distance_source: 'device' | 'geodesic' | 'none';
  pace_s_per_mi: number | null;
  descent_m: number | null;
  max_hr: number | null;
  avg_cad: number | null;
  points: number;
  segments: number;
  ended_at: string;
}

/** A lap as the device recorded it (TCX). */
export interface RunLap {
  index: number;
  started_at: string;
  total_time_s: number;
  distance_m: number | null;
  avg_hr: number | null;
  max_hr: number | null;
}

export interface FastestSection {
  distance_m: number;
  time_s: number;
  pace_s_per_km: number;
  started_at: string;
  start_distance_m: number;
}

export interface HeartRateZonesDetail {
  method: 'heart-rate reserve' | 'percent of maximum';
  max_hr: number;
  resting_hr: number | null;
  /** Zone 0 is "below zone 1"; `to_bpm` null for the top zone. */
  zones: Array<{ zone: number; from_bpm: number; to_bpm: number | null }>;
  /** Moving seconds per zone, indexed by zone number. */
  seconds: number[];
}

export interface EnergyDetail {
  gross_kcal: number;
  net_kcal: number;
  weight_kg: number;
  method: string;
}

/** The run's training load as stored at import (`details.trimp`). */
export interface TrimpDetail extends TrimpResult {
  resting_hr: number;
  max_hr: number;
  method: string;
}

/** `GET /api/runs/:id` */
export interface RunDetail {
  id: string;
  owner_id: string;
  name: string;
  sport: string | null;
  /** Run, ride or hike (issue #14). */
  kind: ActivityKind;
  summary: RunSummary;
  splits: { mi: Split[]; km: Split[] };
  laps: RunLap[];
  fastest_sections: FastestSection[];
  details: {
    cleaning: CleaningReport;
    format: string;
    hr_zones: HeartRateZonesDetail | null;
    energy: EnergyDetail | null;
    /** Banister TRIMP with the profile values it used; null without heart rate, resting and maximum heart rate. */
    trimp?: TrimpDetail | null;
    /** Absent on runs imported before issue #14. */
    distance?: DistanceReportAnswer | null;
  };
}

/** `GET /api/runs/:id/track`: columns thinned to at most 2000 points, nulls where unknown. */
export interface RunTrack {
  points: number;
  step: number;
  t: Array<number | null>;
  d: Array<number | null>;
  lat: Array<number | null>;
  lon: Array<number | null>;
  ele: Array<number | null> | null;
  hr: Array<number | null> | null;
}
