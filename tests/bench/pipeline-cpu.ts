/**
 * CPU time of the import pipeline (parse + analysis) on the bench's 30 h 1 s GPX, for one checkout of the
 * code: run it in fresh processes, alternating two checkouts, and compare the medians (tests/bench/README.md,
 * "The 30 h import with turn-aware smoothing"). CPU time, not wall time: on a shared machine wall time is
 * mostly waiting for a core.
 *
 *   node --import tsx tests/bench/pipeline-cpu.ts <checkout root> [file]
 *
 * Without a file it writes the bench's 30 h GPX (same options as `npm run bench`) to the system's temporary
 * folder first, from this checkout's generator.
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { parseTrackFile as parseOwn } from '../../server/features/runs/parse/parse-track-file.ts';
import type { analyseTrack as analyseOwn } from '../../shared/tracks/analyse.ts';
import { generateLakeRun, longRunPhases } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';

const root = resolve(process.argv[2] ?? '.');
const file = process.argv[3] ?? join(tmpdir(), 'pacewright-bench-30h.gpx');
if (!existsSync(file)) {
  const { points } = generateLakeRun({
    start_t: Date.UTC(2024, 8, 14, 6, 30, 0),
    phases: longRunPhases(30, 1.6),
    seed: 3,
    gps_sigma_m: 1.5,
    ele_sigma_m: 1,
    device_distance: false,
  });
  writeFileSync(file, writeGpx('Lake Tamsel long run', [points]));
}
const load = (path: string) => import(pathToFileURL(join(root, path)).href);
const { parseTrackFile } = (await load('server/features/runs/parse/parse-track-file.ts')) as { parseTrackFile: typeof parseOwn };
const { analyseTrack } = (await load('shared/tracks/analyse.ts')) as { analyseTrack: typeof analyseOwn };

const bytes = readFileSync(file);
const cpuMs = (from: NodeJS.CpuUsage): number => {
  const used = process.cpuUsage(from);
  return Math.round((used.user + used.system) / 1000);
};
const start = process.cpuUsage();
const [run] = parseTrackFile(bytes);
const parseMs = cpuMs(start);
const afterParse = process.cpuUsage();
const analysis = analyseTrack(run!.track);
const analyseMs = cpuMs(afterParse);
console.log(
  JSON.stringify({
    root,
    parse_cpu_ms: parseMs,
    analyse_cpu_ms: analyseMs,
    total_cpu_ms: parseMs + analyseMs,
    distance_km: Math.round(analysis.summary.distance_m) / 1000,
    smoothed: analysis.summary.distance_report.smoothed,
    load: loadavg()[0],
  }),
);
