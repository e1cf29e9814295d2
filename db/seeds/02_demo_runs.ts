import type { Knex } from 'knex';
import { importFiles, type UploadedFile } from '../../server/features/runs/runs.service.ts';
import type { UserRow } from '../../server/lib/db.ts';
import type { FileStore } from '../../server/lib/storage.ts';
import { generateLakeRun, longRunPhases, type Phase, type SyntheticOptions } from '../../shared/tracks/synthetic.ts';
import type { DeviceLap } from '../../shared/tracks/types.ts';
import { writeGpx, writeTcx } from '../../shared/tracks/write-track.ts';
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

function sessionFor(weekday: number, speed: number, week: number): { label: string; phases: Phase[]; laps?: number[] } | null {
  switch (weekday) {
    case 1:
      return { label: 'easy', phases: easy(45 + week * 5, speed * 0.88) };
    case 2: {
      const { phases, laps } = intervals(speed);
      return { label: 'intervals', phases, laps };
    }
    case 3:
      return { label: 'easy', phases: easy(50, speed * 0.86) };
    case 5: {
      // The long run: a bottle stop each hour, the last half hour at goal pace.
      const hours = 1 + (week >= 1 ? 1 : 0);
      return {
        label: 'long run',
        phases: [...longRunPhases(hours, speed * 0.9), { kind: 'run', duration_s: 1800, speed_mps: speed * 1.05 }],
      };
    }
    case 6:
      return { label: 'recovery', phases: easy(35, speed * 0.8) };
    default:
      return null;
  }
}

export async function seed(knex: Knex, store: FileStore, today = new Date()): Promise<void> {
  const runners = (await knex('users').whereILike('email', `%@${DEMO_DOMAIN}`).andWhere({ role: 'runner' })) as UserRow[];
  // Monday `WEEKS` weeks before this week's Monday, in UTC calendar terms.
  const day = Date.UTC(today.getUTCFullYear(), today.getUTCMonth(), today.getUTCDate());
  const mondayThisWeek = day - ((new Date(day).getUTCDay() + 6) % 7) * 86_400_000;
  const firstMonday = mondayThisWeek - WEEKS * 7 * 86_400_000;
  for (const [r, runner] of runners.entries()) {
    const speed = RUNNER_SPEEDS[runner.email.split('@')[0]!] ?? 3.3;
    const files: UploadedFile[] = [];
    for (let d = 0; d < WEEKS * 7 + 7; d++) {
      const date = firstMonday + d * 86_400_000;
      if (date >= day) break; // up to yesterday
      const week = Math.floor(d / 7);
      const session = sessionFor(d % 7, speed, week % 3);
      if (!session) continue;
      // 12:30 UTC is early morning on the American demo runners' clocks.
      const options: SyntheticOptions = {
        start_t: date + (12 * 60 + 30 + r * 17) * 60_000,
        phases: session.phases,
        seed: 100 + r * 50 + d,
        gps_sigma_m: 1.2,
        ele_sigma_m: 0.8,
        sample_s: 2,
      };
      const iso = new Date(date).toISOString().slice(0, 10);
      files.push(demoFile(`lake ${session.label} ${iso}`, options, session.laps));
    }
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
