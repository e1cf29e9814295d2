/**
 * CPU time of one import against its `indexOf` floor, for checkouts side by side (issue 19).
 *
 *   node --import tsx tests/bench/import-cpu.ts [--rounds N] <file> <checkout> [<checkout>…]
 *
 * Each round runs every checkout once, in turn, each in a fresh Node process that imports that
 * checkout's `parseTrackFile` and `analyseTrack`, warms up on the first 2 000 points' worth of the
 * same file's bytes, then measures, with `process.cpuUsage()` (user + system, this process) and
 * wall time: the floor (read the file, decode it to text, count `<trkpt`/`<Trackpoint` with
 * indexOf, as `npm run bench`'s floor-scan) and the import (read, `parseTrackFile`, `analyseTrack`),
 * in alternating order. On a shared 2-core machine wall time is mostly waiting for a core; CPU
 * time moves far less with other work. Prints one line per process with the load average, then
 * the median per checkout.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type * as ParseModule from '../../server/features/runs/parse/parse-track-file.ts';
import type * as AnalyseModule from '../../shared/tracks/analyse.ts';

interface Sample {
  checkout: string;
  floor_cpu: number;
  floor_wall: number;
  read_cpu: number;
  parse_cpu: number;
  analyse_cpu: number;
  import_cpu: number;
  import_wall: number;
  points: number;
  distance_m: number;
}

const cpuMs = (): number => {
  const { user, system } = process.cpuUsage();
  return (user + system) / 1000;
};

async function child(checkout: string, file: string): Promise<Sample> {
  const { parseTrackFile } = (await import(
    resolve(checkout, 'server/features/runs/parse/parse-track-file.ts')
  )) as typeof ParseModule;
  const { analyseTrack } = (await import(resolve(checkout, 'shared/tracks/analyse.ts'))) as typeof AnalyseModule;
  const needle = file.endsWith('.tcx') ? '<Trackpoint' : '<trkpt';

  // Warm up on the start of the same file, closed after 2 000 points, so the figures are not JIT warm-up.
  const whole = readFileSync(file, 'latin1');
  let cut = 0;
  for (let k = 0; k < 2000 && cut !== -1; k++) cut = whole.indexOf(needle, cut + 1);
  const closing = file.endsWith('.tcx')
    ? '</Track></Lap></Activity></Activities></TrainingCenterDatabase>'
    : '</trkseg></trk></gpx>';
  const warm = Buffer.from(whole.slice(0, cut) + closing, 'latin1');
  parseTrackFile(warm).forEach((run) => analyseTrack(run.track));

  const floor = (): [number, number] => {
    const c0 = cpuMs();
    const w0 = performance.now();
    const text = readFileSync(file).toString('utf8');
    let count = 0;
    for (let at = text.indexOf(needle); at !== -1; at = text.indexOf(needle, at + needle.length)) count++;
    if (count === 0) throw new Error('no points');
    return [cpuMs() - c0, performance.now() - w0];
  };
  const pipeline = (): Omit<Sample, 'checkout' | 'floor_cpu' | 'floor_wall'> => {
    const c0 = cpuMs();
    const w0 = performance.now();
    const bytes = readFileSync(file);
    const c1 = cpuMs();
    const run = parseTrackFile(bytes)[0]!;
    const c2 = cpuMs();
    const analysis = analyseTrack(run.track);
    const c3 = cpuMs();
    return {
      read_cpu: c1 - c0,
      parse_cpu: c2 - c1,
      analyse_cpu: c3 - c2,
      import_cpu: c3 - c0,
      import_wall: performance.now() - w0,
      points: run.track.columns.length,
      distance_m: analysis.summary.distance_m,
    };
  };
  const floorFirst = process.pid % 2 === 0;
  const [floorCpu, floorWall] = floorFirst ? floor() : [0, 0];
  const measured = pipeline();
  const [floorCpuLast, floorWallLast] = floorFirst ? [floorCpu, floorWall] : floor();
  return { checkout, floor_cpu: floorCpuLast, floor_wall: floorWallLast, ...measured };
}

const median = (values: number[]): number => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? (sorted[mid] as number) : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
};

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  if (args[0] === '--child') {
    console.log(JSON.stringify(await child(args[1] as string, args[2] as string)));
    return;
  }
  let rounds = 5;
  if (args[0] === '--rounds') {
    rounds = Number(args[1]);
    args.splice(0, 2);
  }
  const [file, ...checkouts] = args;
  if (!file || checkouts.length === 0) throw new Error('usage: import-cpu.ts [--rounds N] <file> <checkout>…');
  const self = fileURLToPath(import.meta.url);
  const samples: Sample[] = [];
  const f = (n: number): string => n.toFixed(0).padStart(5);
  for (let round = 0; round < rounds; round++) {
    for (const checkout of checkouts) {
      const run = spawnSync(process.execPath, ['--import', 'tsx', self, '--child', resolve(checkout), resolve(file)], {
        encoding: 'utf8',
      });
      if (run.status !== 0) throw new Error(run.stderr);
      const sample = JSON.parse(run.stdout.trim().split('\n').pop() ?? '') as Sample;
      samples.push(sample);
      console.log(
        `${checkout.padEnd(24)} CPU ms: floor ${f(sample.floor_cpu)}  import ${f(sample.import_cpu)} (read ${f(sample.read_cpu)} parse ${f(sample.parse_cpu)} analysis ${f(sample.analyse_cpu)})  ratio ${(sample.import_cpu / sample.floor_cpu).toFixed(2)}  | wall: floor ${f(sample.floor_wall)} import ${f(sample.import_wall)} ratio ${(sample.import_wall / sample.floor_wall).toFixed(2)}  | load ${loadavg()[0]!.toFixed(1)}  ${(sample.distance_m / 1000).toFixed(3)} km`,
      );
    }
  }
  console.log('\nmedians (CPU ms; ratio = import ÷ floor, per process):');
  for (const checkout of checkouts) {
    const of = samples.filter((s) => s.checkout === resolve(checkout));
    const m = (key: keyof Sample): string => f(median(of.map((s) => s[key] as number)));
    console.log(
      `${checkout.padEnd(24)} floor ${m('floor_cpu')}  parse ${m('parse_cpu')}  analysis ${m('analyse_cpu')}  import ${m('import_cpu')}  CPU ratio ${median(of.map((s) => s.import_cpu / s.floor_cpu)).toFixed(2)}  wall ratio ${median(of.map((s) => s.import_wall / s.floor_wall)).toFixed(2)}`,
    );
  }
}

await main();
