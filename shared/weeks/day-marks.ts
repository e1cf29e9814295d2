/**
 * Days that are not runs: a day marked rest, ill, injured or cross-training (with minutes). They
 * change how a week reads: a session planned on a day marked ill is "missed — ill", not a plain
 * miss; cross-training adds its minutes to the week's time but nothing to its running distance.
 */

export type DayMarkKind = 'rest' | 'ill' | 'injured' | 'cross-training';

export interface WeekDayMark {
  date: string;
  kind: DayMarkKind;
  /** Minutes of cross-training; null for the other kinds. */
  minutes: number | null;
  note: string;
}

/** Why a planned session was not run, from the day's mark: the mark's kind, or null when the day is unmarked. */
export type MissedReason = DayMarkKind;

/** The mark of `date` among `marks` (one per date; the first wins if a caller passes more). */
export function dayMarkOf(date: string, marks: readonly WeekDayMark[]): WeekDayMark | null {
  return marks.find((m) => m.date === date) ?? null;
}

/** The reason a session planned on `date` and not run was missed: the day's mark kind, or null (a plain miss). */
export function missedReasonOf(date: string, marks: readonly WeekDayMark[]): MissedReason | null {
  return dayMarkOf(date, marks)?.kind ?? null;
}

/**
 * Seconds of cross-training over the marks: minutes × 60 for cross-training days; other kinds and
 * missing, negative or non-finite minutes count 0.
 */
export function crossTrainingSeconds(marks: readonly WeekDayMark[]): number {
  let seconds = 0;
  for (const m of marks) {
    if (m.kind === 'cross-training' && m.minutes !== null && Number.isFinite(m.minutes) && m.minutes > 0)
      seconds += m.minutes * 60;
  }
  return seconds;
}

/** "missed — ill", "missed — rest day", or "missed" for an unmarked day: the words a week shows for a missed session. */
export function missedLabel(reason: MissedReason | null): string {
  if (reason === null) return 'missed';
  return `missed — ${reason === 'rest' ? 'rest day' : reason}`;
}
