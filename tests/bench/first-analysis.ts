/**
 * Where the first big analysis in a process goes (issue 19, session 9): the bench's pipeline case
 * (import-bench.ts: warm up on the one-hour file, then parse and analyse the 30 h file) in this process,
 * with the analysis taken apart.
 *
 *   node --expose-gc --import tsx tests/bench/first-analysis.ts [gpx|tcx] [--again] [--count] [--profile]
 *     [--warm N] [--root <checkout>]
 *
 * Prints, for the measured analysis (and with `--again` for a second one on the same track): wall and CPU
 * time of the process, CPU of this thread and of the others (from /proc/self/task/*\/stat, in 10 ms ticks),
 * minor page faults of this thread and of the process (field 10 of /proc/thread-self/stat and
 * /proc/self/stat), and the growth of `arrayBuffers` (process.memoryUsage). `--count` counts the bytes of
 * typed arrays made inside the analysis (by wrapping the typed-array constructors, so its times are not the
 * bench's: use it only for the bytes; views over an existing buffer are not counted). `--profile` writes a CPU profile of the measured analysis alone
 * (node:inspector, 100 µs sampling) to first-analysis.cpuprofile and prints its heaviest functions; with
 * `--again`, of the second (warm) analysis instead.
 * Run with --trace-gc, or --trace-opt --trace-deopt, to see what happens between the markers it writes
 * to stdout ("== analysis start" / "== analysis end").
 *
 * The files are written by bench-files.ts to the system's temporary folder (same bytes as `npm run bench`).
 */
import { existsSync, readdirSync, readFileSync, writeFileSync, writeSync } from 'node:fs';
import { Session } from 'node:inspector';
import { loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import type * as ParseModule from '../../server/features/runs/parse/parse-track-file.ts';
import type * as AnalyseModule from '../../shared/tracks/analyse.ts';
import { writeDocument } from './bench-files.ts';

const args = process.argv.slice(2);
const format = args.includes('tcx') ? 'tcx' : 'gpx';
const again = args.includes('--again');
const count = args.includes('--count');
const profile = args.includes('--profile');
/** `--root <checkout>`: that checkout's parse and analysis (to compare two checkouts in alternating processes). */
const root = resolve(args.includes('--root') ? (args[args.indexOf('--root') + 1] as string) : '.');
const load = (path: string): Promise<unknown> => import(pathToFileURL(join(root, path)).href);
const { parseTrackFile } = (await load('server/features/runs/parse/parse-track-file.ts')) as typeof ParseModule;
const { analyseTrack } = (await load('shared/tracks/analyse.ts')) as typeof AnalyseModule;
/** `--warm N`: the warm-up N times instead of once (to tell JIT warm-up from fresh memory). */
const warmings = args.includes('--warm') ? Number(args[args.indexOf('--warm') + 1]) : 1;

const file = join(tmpdir(), `pacewright-bench-30h-first.${format}`);
if (!existsSync(file)) writeFileSync(file, writeDocument(format, 30, 1.6));

/** Field `k` (1-based, as proc(5) numbers them) of a /proc stat line. */
function statField(path: string, k: number): number {
  const line = readFileSync(path, 'latin1');
  // Fields after the command name, which is in parentheses and may hold spaces.
  const rest = line.slice(line.lastIndexOf(')') + 2).split(' ');
  return Number(rest[k - 3]);
}

/** utime + stime of every thread of this process, in clock ticks (10 ms), by thread id. */
function threadTicks(): Map<string, { name: string; ticks: number }> {
  const out = new Map<string, { name: string; ticks: number }>();
  for (const tid of readdirSync('/proc/self/task')) {
    try {
      const name = readFileSync(`/proc/self/task/${tid}/comm`, 'latin1').trim();
      const ticks = statField(`/proc/self/task/${tid}/stat`, 14) + statField(`/proc/self/task/${tid}/stat`, 15);
      out.set(tid, { name, ticks });
    } catch {
      // The thread ended between the listing and the read.
    }
  }
  return out;
}

let allocated = 0;
let allocations = 0;
if (count) {
  // Count the bytes of every typed array made while `counting` is on (wrapping the global constructors
  // before the analysis first runs, so every module reads the wrapped ones).
  for (const name of [
    'Float64Array',
    'Float32Array',
    'Int32Array',
    'Uint32Array',
    'Uint8Array',
    'Int8Array',
    'Int16Array',
    'Uint16Array',
  ] as const) {
    const Base = globalThis[name] as unknown as new (...a: unknown[]) => ArrayBufferView;
    const Counted = class extends (Base as unknown as new (...a: unknown[]) => ArrayBufferView) {
      constructor(...a: unknown[]) {
        super(...a);
        // Views over an existing buffer (subarray, or a column laid over spent room) make no new memory.
        if (counting && !(a[0] instanceof ArrayBuffer)) {
          allocated += this.byteLength;
          allocations++;
        }
      }
    };
    Object.defineProperty(globalThis, name, { value: Counted, writable: true, configurable: true });
  }
}
let counting = false;

function mark(text: string): void {
  writeSync(1, `== ${text}\n`);
}

function measure(label: string, run: () => unknown): void {
  const ticks0 = threadTicks();
  const thread0 = statField('/proc/thread-self/stat', 10);
  const process0 = statField('/proc/self/stat', 10);
  const buffers0 = process.memoryUsage().arrayBuffers;
  const cpu0 = process.cpuUsage();
  allocated = 0;
  allocations = 0;
  mark(`${label} start`);
  counting = true;
  const w0 = performance.now();
  run();
  const wall = performance.now() - w0;
  counting = false;
  mark(`${label} end`);
  const cpu = process.cpuUsage(cpu0);
  const thread1 = statField('/proc/thread-self/stat', 10);
  const process1 = statField('/proc/self/stat', 10);
  const buffers1 = process.memoryUsage().arrayBuffers;
  const ticks1 = threadTicks();
  const byName = new Map<string, number>();
  for (const [tid, after] of ticks1) {
    const grew = after.ticks - (ticks0.get(tid)?.ticks ?? 0);
    const name = tid === String(process.pid) ? 'main' : after.name;
    if (grew > 0) byName.set(name, (byName.get(name) ?? 0) + grew * 10);
  }
  console.log(
    JSON.stringify({
      label,
      root,
      format,
      wall_ms: Math.round(wall),
      cpu_ms: Math.round((cpu.user + cpu.system) / 1000),
      // System time is mostly the kernel zero-filling pages touched for the first time.
      system_ms: Math.round(cpu.system / 1000),
      thread_cpu_ms: Object.fromEntries(byName),
      thread_minor_faults: thread1 - thread0,
      process_minor_faults: process1 - process0,
      array_buffers_growth_mb: Math.round(((buffers1 - buffers0) / 1048576) * 10) / 10,
      ...(count ? { typed_arrays: allocations, typed_array_mb: Math.round((allocated / 1048576) * 10) / 10 } : {}),
      load: loadavg()[0],
    }),
  );
}

// The bench's warm-up: the one-hour run (longRunPhases rounds 0.2 h up to a whole hour).
const warmUp = Buffer.from(writeDocument(format, 0.2, 3.2));
for (let k = 0; k < warmings; k++) analyseTrack(parseTrackFile(warmUp)[0]!.track);

// As the bench: collect, then read, parse and analyse with no collection in between.
globalThis.gc?.();
const run = parseTrackFile(readFileSync(file))[0]!;
const session = profile ? new Session() : null;
if (session) {
  session.connect();
  session.post('Profiler.enable');
  session.post('Profiler.setSamplingInterval', { interval: 100 });
}
measure('analysis', () => {
  if (!again) session?.post('Profiler.start');
  analyseTrack(run.track);
});
if (again) {
  globalThis.gc?.();
  measure('again', () => {
    session?.post('Profiler.start');
    analyseTrack(run.track);
  });
}
if (session) {
  session.post('Profiler.stop', (error, result) => {
    if (error) throw error;
    writeFileSync('first-analysis.cpuprofile', JSON.stringify(result.profile));
    const { nodes, samples = [], timeDeltas = [] } = result.profile;
    const self = new Map<number, number>();
    samples.forEach((id, k) => self.set(id, (self.get(id) ?? 0) + (timeDeltas[k] ?? 0)));
    const byFunction = new Map<string, number>();
    for (const node of nodes) {
      const { functionName, url, lineNumber } = node.callFrame;
      const key = `${functionName || '(anonymous)'} ${url.slice(url.lastIndexOf('/') + 1)}:${lineNumber + 1}`;
      byFunction.set(key, (byFunction.get(key) ?? 0) + (self.get(node.id) ?? 0));
    }
    const top = [...byFunction].sort((a, b) => b[1] - a[1]).slice(0, 25);
    for (const [key, us] of top) console.log(`${(us / 1000).toFixed(1).padStart(7)} ms  ${key}`);
  });
}
