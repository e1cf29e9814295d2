import type { RunListItem } from '../../../../shared/runs/schemas.ts';
import type { SquadDetail } from '../../../../shared/squads/schemas.ts';
import type { WeekPlan, WeekReview, WeekRun } from '../../../../shared/weeks/week-review.ts';

// Answers of the squad and week routes (server/features/weeks/weeks.service.ts, squads.service.ts).

export type { SquadDetail };

/** A run of the week: the week-review figures plus the run's list item (name, local time…). */
export type WeekDayRun = WeekRun & RunListItem;

export interface WeekNote {
  id: string;
  text: string;
  created_at: string;
  author: { id: string; name: string; role: string };
}

export interface RunnerWeek extends Omit<WeekReview, 'days'> {
  days: Array<{ date: string; plans: WeekPlan[]; runs: WeekDayRun[] }>;
  runner_id: string;
  runner: { id: string; name: string };
  start: string;
  end: string;
  today: string;
  week_starts_on: number;
  /** Twelve weeks, oldest first; the last is this week. */
  trend: Array<{ start: string; run_distance_m: number; trimp: number }>;
  last_upload: string | null;
  reviewed_by: Array<{ coach_id: string; coach_name: string; reviewed_at: string }>;
  notes: WeekNote[];
}

export interface OverviewRow {
  runner: { id: string; name: string };
  /** The runner's own first day of the week. */
  start: string;
  planned_distance_m: number;
  run_distance_m: number;
  moving_s: number;
  sessions_planned: number;
  sessions_as_planned: number;
  flags: Array<{ code: string; message: string }>;
  last_upload: string | null;
  reviewed: boolean;
  /** Metres per week, oldest first; the last is this week. */
  volume_12_weeks: number[];
}

export interface SquadOverview {
  squad: { id: string; name: string };
  week: string | null;
  rows: OverviewRow[];
}

export interface DigestReceipt {
  sent_to: string;
  week_start: string;
  /** Heading → runner names, in the e-mail's order. */
  groups: Record<string, string[]>;
}
