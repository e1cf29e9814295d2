import type { Knex } from 'knex';
import { importFiles, type UploadedFile } from '../../server/features/runs/index.ts';
import type { UserRow } from '../../server/lib/db.ts';
import type { FileStore } from '../../server/lib/storage.ts';
import { generateLakeRun, longRunPhases, type Phase, type SyntheticOptions } from '../../shared/tracks/synthetic.ts';
import type { DeviceLap } from '../../shared/tracks/types.ts';
import { writeGpx, writeTcx } from '../../shared/tracks/write-track.ts';
import { parseShorthand } from '../../shared/plans/shorthand.ts';
import { DEMO_DOMAIN } from './01_demo_people.ts';

/**
 * Three weeks of generated runs around the invented lake for each demo runner, imported through the
 * real import path (files kept in storage, splits computed). Includes a long run with a bottle stop
 * and a device-lap interval workout (TCX with one lap per rep and recovery).
 */
const WEEKS = 3;
const RUNNER_SPEEDS: Record<string, number> = { ivy: 3.45, tomas: 3.1, priya: 3.7 };

const easy = (minutes: number, speed: number): Phase[] => [{ kind: 'run', duration_s: minutes * 60, speed_mps: speed }];

function intervals(speed: number): { phases: Phase[]; laps: number[] } {
  const phases: Phase[] = [{ kind: 'run', duration_s: 900, speed_mps: speed * 0.92 }];
  for (let i = 0; i < 6; i++) {
    phases.push(
      { kind: 'run', duration_s: 180, speed_mps: speed * 1.3 },
      { kind: 'run', duration_s: 120, speed_mps: speed * 0.75 },
    );
  }
  phases.push({ kind: 'run', duration_s: 600, speed_mps: speed * 0.9 });
  // One device lap per phase, as a watch's lap button would record them.
  return { phases, laps: phases.map((p) => p.duration_s) };
}

function lapsFromDurations(options: SyntheticOptions, durations: number[], totalByPhase: number[]): DeviceLap[] {
  let t = options.start_t;
  return durations.map((d, i) => {
    const lap: DeviceLap = {
      start_t: t,
      total_time_s: d,
      distance_m: Math.round(totalByPhase[i]! * 10) / 10,
      avg_hr: null,
      max_hr: null,
    };
    t += d * 1000;
    return lap;
  });
}

function demoFile(name: string, options: SyntheticOptions, laps?: number[]): UploadedFile {
  const run = generateLakeRun(options);
  if (!laps) return { name: `${name}.gpx`, data: Buffer.from(writeGpx(name, [run.points])) };
  const distances = options.phases.map((p) => (p.kind === 'stop' ? 0 : p.speed_mps * p.duration_s));
  return { name: `${name}.tcx`, data: Buffer.from(writeTcx(run.points, lapsFromDurations(options, laps, distances))) };
}

/** Runs for one day of the week (0 = Monday), or null for a rest day. */
const TITLES: Record<string, string> = {
  easy: 'Easy lake loop',
  intervals: '6 × 3 min with jog recoveries',
  'long run': 'Long run, goal-pace finish',
  recovery: 'Recovery jog',
};

/** m:ss of a pace in seconds per km. */
function mss(secondsPerKm: number): string {
  const s = Math.round(secondsPerKm);
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`;
}

interface DemoSession {
  label: string;
  /** The session plan as the coach wrote it (shorthand). */
  plan: string;
  phases: Phase[];
  laps?: number[];
}

/** The session for one day of the week (0 = Monday), or null for a rest day; `speed` is the runner's reference speed (m/s). */
function sessionFor(weekday: number, speed: number, week: number): DemoSession | null {
  switch (weekday) {
    case 1: {
      const minutes = 45 + week * 5;
      return { label: 'easy', plan: `${minutes} min easy`, phases: easy(minutes, speed * 0.88) };
    }
    case 2: {
      const { phases, laps } = intervals(speed);
      const repPace = 1000 / (speed * 1.3);
      return {
        label: 'intervals',
        plan: `15 min warm-up, 6 x 3 min @ ${mss(repPace - 4)}-${mss(repPace + 4)}/km w/ 2 min jog, 10 min cool-down`,
        phases,
        laps,
      };
    }
    case 3:
      return { label: 'easy', plan: '50 min easy', phases: easy(50, speed * 0.86) };
    case 5: {
      // The long run: a bottle stop each hour, the last half hour at goal marathon pace.
      const hours = 1 + (week >= 1 ? 1 : 0);
      return {
        label: 'long run',
        plan: `${hours} h easy, 30 min @ MP`,
        phases: [...longRunPhases(hours, speed * 0.9), { kind: 'run', duration_s: 1800, speed_mps: speed * 1.05 }],
      };
    }
    case 6:
      return { label: 'recovery', plan: '35 min easy', phases: easy(35, speed * 0.8) };
    default:
      return null;
  }
}

/** One runner skips a rep now and then, so the demo shows a plan check that is not all on pace. */
function withSkippedRep(session: DemoSession, speed: number): DemoSession {
  const phases = session.phases.map((p, i) => (i === 7 && p.kind === 'run' ? { ...p, speed_mps: speed * 0.75 } : p));
  return { ...session, phases };
}

export async function seed(knex: Knex, store: FileStore, today = new Date()): Promise<void> {
  const runners = (await knex('users').whereILike('email', `%@${DEMO_DOMAIN}`).andWhere({ role: 'runner' })) as UserRow[];
  const coach = await knex('users')
    .where({ email: `coach@${DEMO_DOMAIN}` })
    .first();
  // Monday `WEEKS` weeks before this week's Monday, in UTC calendar terms.
  const day = Date.UTC(today.getUTCFullYear(), today.getUTCMonth(), today.getUTCDate());
  const mondayThisWeek = day - ((new Date(day).getUTCDay() + 6) % 7) * 86_400_000;
  const firstMonday = mondayThisWeek - WEEKS * 7 * 86_400_000;
  for (const [r, runner] of runners.entries()) {
    const speed = RUNNER_SPEEDS[runner.email.split('@')[0]!] ?? 3.3;
    const files: UploadedFile[] = [];
    const plans: Array<{
      runner_id: string;
      author_id: string | null;
      updated_by: string | null;
      date: string;
      title: string;
      items: string;
    }> = [];
    // The goal: an invented autumn-style marathon ten weeks out, at the pace of the long runs' last half hour.
    const raceDay = new Date(mondayThisWeek + (10 * 7 + 6) * 86_400_000).toISOString().slice(0, 10);
    await knex('goal_races').insert({
      user_id: runner.id,
      name: 'Lakeside Marathon',
      date: raceDay,
      distance_m: 42195,
      goal_time_s: Math.round(42195 / (speed * 1.05)),
    });
    // Plans run through next week: the week the demo coach has just prescribed.
    for (let d = 0; d < WEEKS * 7 + 14; d++) {
      const date = firstMonday + d * 86_400_000;
      const week = Math.floor(d / 7);
      const planned = sessionFor(d % 7, speed, week % 3);
      if (!planned) continue;
      const iso = new Date(date).toISOString().slice(0, 10);
      const parsed = parseShorthand(planned.plan);
      if (!parsed.ok) throw new Error(`demo plan does not parse: ${planned.plan}: ${parsed.error.message}`);
      plans.push({
        runner_id: runner.id,
        author_id: coach?.id ?? null,
        updated_by: coach?.id ?? null,
        date: iso,
        title: TITLES[planned.label]!,
        items: JSON.stringify(parsed.items),
      });
      if (date >= day) continue; // runs up to yesterday, plans for the rest of this week and next week too
      // A little of real life: Tomás skips a rep and misses a long run; Priya cuts a goal-pace block short.
      if (r === 1 && planned.label === 'long run' && week === WEEKS - 2) continue;
      let session = r === 1 && planned.label === 'intervals' && week === WEEKS - 1 ? withSkippedRep(planned, speed) : planned;
      if (r === 2 && planned.label === 'long run' && week === WEEKS - 1) {
        session = {
          ...planned,
          phases: planned.phases.map((p, i, all) => (i === all.length - 1 ? { ...p, duration_s: 1200 } : p)),
        };
      }
      // 12:30 UTC is early morning on the American demo runners' clocks.
      const options: SyntheticOptions = {
        start_t: date + (12 * 60 + 30 + r * 17) * 60_000,
        phases: session.phases,
        seed: 100 + r * 50 + d,
        gps_sigma_m: 1.2,
        ele_sigma_m: 0.8,
        sample_s: 2,
      };
      files.push(demoFile(`lake ${session.label} ${iso}`, options, session.laps));
    }
    await knex('session_plans').insert(plans);
    const result = await importFiles(runner, files, store);
    if (result.rejected.length) throw new Error(`demo runs rejected: ${JSON.stringify(result.rejected)}`);
    for (const run of result.imported) {
      const label = run.file.replace(/^lake (.*) \d{4}-\d\d-\d\d\.(gpx|tcx)$/, '$1');
      await knex('runs')
        .where({ id: run.id })
        .update({ name: TITLES[label] ?? run.name });
    }
  }
}
