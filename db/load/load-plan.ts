/**
 * The generated history of `npm run seed:load` (server/cli/seed-load.ts), as pure functions: who the
 * load runners and coaches are, how the squads are cut, and which session each runner runs on each
 * day. Everyone is invented ("Load Runner 017") and every run goes around the invented Lake Tamsel of
 * shared/tracks/synthetic.ts. Everything is derived from the runner's number and the date, so a
 * resumed load generates byte-identical files (and the import's SHA-256 duplicate rule agrees).
 */
import { createPrng, type Phase } from '../../shared/tracks/synthetic.ts';
import { addDays, dayOfWeek, daysBetween } from '../../shared/weeks/weeks.ts';

export const LOAD_DOMAIN = 'tamsel-load.test';
export const LOAD_PASSWORD = 'tamsel-load-demo';
export const LOAD_TIME_ZONE = 'UTC';
/** Runners per squad; the squad overview is specified for squads of up to 50. */
export const LOAD_SQUAD_SIZE = 25;
const MAX_RUNNERS = 999;
const MAX_YEARS = 20;
/** Day numbers (PRNG seeds) count from here. */
const EPOCH = '2000-01-01';

export interface LoadSettings {
  runners: number;
  years: number;
  /** Files handed to one `importFiles` call. */
  batch: number;
  /** Runners imported at the same time. */
  concurrency: number;
}

export type LoadSettingsResult = { ok: true; settings: LoadSettings } | { ok: false; error: string };

function whole(value: string | undefined, fallback: number, name: string, max: number): number | string {
  if (value === undefined || value.trim() === '') return fallback;
  const n = Number(value);
  return Number.isInteger(n) && n >= 1 && n <= max ? n : `${name} must be a whole number from 1 to ${max}, not '${value}'.`;
}

/**
 * Reads LOAD_RUNNERS (default 50, 1–999), LOAD_YEARS (default 3, > 0 and ≤ 20, fractions allowed),
 * LOAD_BATCH (default 100 files) and LOAD_CONCURRENCY (default 2 runners) from the given values.
 */
export function parseLoadSettings(env: Record<string, string | undefined>): LoadSettingsResult {
  const runners = whole(env.LOAD_RUNNERS, 50, 'LOAD_RUNNERS', MAX_RUNNERS);
  const batch = whole(env.LOAD_BATCH, 100, 'LOAD_BATCH', 1000);
  const concurrency = whole(env.LOAD_CONCURRENCY, 2, 'LOAD_CONCURRENCY', 16);
  const yearsText = env.LOAD_YEARS?.trim() ? env.LOAD_YEARS : undefined;
  const years = yearsText === undefined ? 3 : Number(yearsText);
  for (const v of [runners, batch, concurrency]) if (typeof v === 'string') return { ok: false, error: v };
  if (!Number.isFinite(years) || years <= 0 || years > MAX_YEARS)
    return { ok: false, error: `LOAD_YEARS must be a number above 0 and at most ${MAX_YEARS}, not '${env.LOAD_YEARS}'.` };
  return {
    ok: true,
    settings: { runners: runners as number, years, batch: batch as number, concurrency: concurrency as number },
  };
}

/** 'Load Runner 017' for runner 17 (numbers start at 1). */
export function loadRunnerName(number: number): string {
  return `Load Runner ${String(number).padStart(3, '0')}`;
}

export function loadRunnerEmail(number: number): string {
  return `runner${String(number).padStart(3, '0')}@${LOAD_DOMAIN}`;
}

export function loadCoachName(number: number): string {
  return `Load Coach ${String(number).padStart(2, '0')}`;
}

export function loadCoachEmail(number: number): string {
  return `coach${String(number).padStart(2, '0')}@${LOAD_DOMAIN}`;
}

export interface LoadSquad {
  name: string;
  /** Coach number (1-based). */
  coach: number;
  /** Runner numbers (1-based). */
  runners: number[];
}

/**
 * Squads of at most `squadSize` consecutive runners (the last one may be smaller), each with its own
 * coach. Zero runners give no squads. Throws RangeError for a squad size outside 1–50.
 */
export function planLoadSquads(runnerCount: number, squadSize: number = LOAD_SQUAD_SIZE): LoadSquad[] {
  if (!Number.isInteger(squadSize) || squadSize < 1 || squadSize > 50) throw new RangeError('squad size must be 1–50');
  const squads: LoadSquad[] = [];
  for (let first = 1; first <= runnerCount; first += squadSize) {
    const k = squads.length;
    squads.push({
      name: `Lake Tamsel Load Squad ${k + 1}`,
      coach: k + 1,
      runners: Array.from({ length: Math.min(squadSize, runnerCount - first + 1) }, (_, i) => first + i),
    });
  }
  return squads;
}

/** Number of distinct coaches the squads need. */
export function loadCoachCount(squads: readonly LoadSquad[]): number {
  return squads.reduce((n, s) => Math.max(n, s.coach), 0);
}

export interface LoadRunnerProfile {
  number: number;
  /** Reference speed, m/s (2.6–4.2: a 6:25/km to a 3:58/km runner). */
  speed_mps: number;
  /** Scales every session's duration (0.75–1.25). */
  volume: number;
  /** The weekly rest day, 0 = Sunday. */
  rest_weekday: number;
  /** Minutes after 06:00 UTC the runner usually starts. */
  start_offset_min: number;
}

/** The runner's fixed traits, derived from their number. */
export function loadRunnerProfile(number: number): LoadRunnerProfile {
  const random = createPrng(7919 * number + 17);
  return {
    number,
    speed_mps: Math.round((2.6 + 1.6 * random()) * 100) / 100,
    volume: Math.round((0.75 + 0.5 * random()) * 100) / 100,
    rest_weekday: number % 7,
    start_offset_min: Math.floor(random() * 180),
  };
}

/** The dates of a history of `years` years ending on `end` (inclusive), oldest first; at least one day. */
export function loadDates(end: string, years: number): string[] {
  const days = Math.max(1, Math.round(years * 365));
  return Array.from({ length: days }, (_, i) => addDays(end, i - days + 1));
}

export type LoadSessionKind = 'easy' | 'intervals' | 'tempo' | 'long run' | 'recovery';

export interface LoadSession {
  date: string;
  kind: LoadSessionKind;
  title: string;
  /** The plan as the coach wrote it (shorthand, see shared/plans/shorthand.ts). */
  plan: string;
  phases: Phase[];
  /** Start, ms since the epoch (the runner's local date is `date` in UTC). */
  start_t: number;
  /** Seconds between recorded points: 10–15, so the history loads quickly. */
  sample_s: number;
  seed: number;
}

const TITLES: Record<LoadSessionKind, string> = {
  easy: 'Easy loop of Lake Tamsel',
  intervals: 'Reps along the north shore',
  tempo: 'Tempo on the shore path',
  'long run': 'Long run around the lake',
  recovery: 'Recovery jog',
};

/** m:ss of a pace in seconds per km. */
function mss(secondsPerKm: number): string {
  const s = Math.round(secondsPerKm);
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`;
}

function paceRange(speed: number): string {
  const pace = 1000 / speed;
  return `${mss(pace - 4)}-${mss(pace + 4)}/km`;
}

/** Training days after the rest day, in order: position 1 is the day after the rest day. */
const WEEK: readonly (LoadSessionKind | null)[] = [null, 'easy', 'intervals', 'easy', 'tempo', 'recovery', 'long run'];

/**
 * The session `profile` runs on `date`, or null on their weekly rest day. Durations vary by runner
 * (volume) and by day (±15 %), speeds by day (±4 %); a long run stops a minute for a bottle each hour.
 */
export function loadSessionFor(profile: LoadRunnerProfile, date: string): LoadSession | null {
  const kind = WEEK[(dayOfWeek(date) - profile.rest_weekday + 7) % 7];
  if (!kind) return null;
  const day = daysBetween(EPOCH, date);
  const seed = profile.number * 100_003 + day;
  const random = createPrng(seed);
  const stretch = profile.volume * (0.85 + 0.3 * random());
  const v = profile.speed_mps * (0.96 + 0.08 * random());
  const minutes = (base: number) => Math.max(20, Math.round((base * stretch) / 5) * 5);
  let plan: string;
  let phases: Phase[];
  switch (kind) {
    case 'easy':
    case 'recovery': {
      const m = minutes(kind === 'easy' ? 50 : 35);
      plan = `${m} min easy`;
      phases = [{ kind: 'run', duration_s: m * 60, speed_mps: v * (kind === 'easy' ? 0.86 : 0.78) }];
      break;
    }
    case 'intervals': {
      const reps = 4 + Math.floor(random() * 5);
      plan = `15 min warm-up, ${reps} x 3 min @ ${paceRange(v * 1.25)} w/ 2 min jog, 10 min cool-down`;
      phases = [{ kind: 'run', duration_s: 900, speed_mps: v * 0.85 }];
      for (let i = 0; i < reps; i++)
        phases.push({ kind: 'run', duration_s: 180, speed_mps: v * 1.25 }, { kind: 'run', duration_s: 120, speed_mps: v * 0.7 });
      phases.push({ kind: 'run', duration_s: 600, speed_mps: v * 0.85 });
      break;
    }
    case 'tempo': {
      const m = minutes(25);
      plan = `15 min warm-up, ${m} min @ ${paceRange(v * 1.1)}, 10 min cool-down`;
      phases = [
        { kind: 'run', duration_s: 900, speed_mps: v * 0.85 },
        { kind: 'run', duration_s: m * 60, speed_mps: v * 1.1 },
        { kind: 'run', duration_s: 600, speed_mps: v * 0.85 },
      ];
      break;
    }
    case 'long run': {
      const m = minutes(100);
      plan = `${m} min easy`;
      phases = [];
      for (let left = m * 60; left > 0; left -= 3600) {
        phases.push({ kind: 'run', duration_s: Math.min(left, 3540), speed_mps: v * 0.88 });
        if (left > 3600) phases.push({ kind: 'stop', duration_s: 60 });
      }
      break;
    }
  }
  return {
    date,
    kind,
    title: TITLES[kind],
    plan,
    phases,
    start_t: Date.parse(`${date}T06:00:00Z`) + (profile.start_offset_min + Math.floor(random() * 30)) * 60_000,
    sample_s: 10 + Math.floor(random() * 6),
    seed,
  };
}

/** Every session of the runner over `dates` (rest days left out). */
export function loadSessionsOf(profile: LoadRunnerProfile, dates: readonly string[]): LoadSession[] {
  return dates.map((d) => loadSessionFor(profile, d)).filter((s): s is LoadSession => s !== null);
}

export interface LoadWeekFeedback {
  /** Monday of the week (the load runners keep the default week start). */
  week_start: string;
  /** Whether the coach marked the week reviewed: four weeks in five. */
  reviewed: boolean;
  /** A coach's note on every third week, else null. */
  note: string | null;
}

/** The coach's reviews and notes on each runner's weeks that start inside `dates`. */
export function loadWeekFeedback(profile: LoadRunnerProfile, dates: readonly string[]): LoadWeekFeedback[] {
  return dates
    .filter((d) => dayOfWeek(d) === 1)
    .map((weekStart, k) => ({
      week_start: weekStart,
      reviewed: (k + profile.number) % 5 !== 0,
      note: (k + profile.number) % 3 === 0 ? `Week ${k + 1}: steady work around the lake, keep the easy days easy.` : null,
    }));
}
