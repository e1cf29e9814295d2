import type { SquadDetail } from '../../../../shared/squads/schemas.ts';

// Answers of the squad and week routes (server/features/weeks/weeks.service.ts, squads.service.ts).

export type { SquadDetail };

export interface OverviewRow {
  runner: { id: string; name: string };
  /** The runner's own first day of the week. */
  start: string;
  planned_distance_m: number;
  run_distance_m: number;
  moving_s: number;
  sessions_planned: number;
  sessions_as_planned: number;
  sessions_due: number;
  planned_duration_s: number;
  unread_notes: number;
  high_soreness: number;
  missed_key_sessions: number;
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
