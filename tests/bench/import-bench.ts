/**
 * Import benchmark: how long and how much memory it takes to read and analyse a long 1 s GPX.
 * Writes a 3-hour and a 100-mile run around the invented lake into a temporary folder, then
 * measures each case in a fresh Node process (so one case's heap cannot hide the next one's
 * growth): parse (`parseTrackFile`: decode, detect, read, clean), analyse (`analyseTrack`),
 * total, and the peak RSS growth over the process's baseline. A baseline row times the
 * tokeniser the importer used before, a fast-xml-parser 5 whole-document parse (validate +
 * tree, no readers), on the same file.
 *
 * Run with `npm run bench`. Timings on a shared machine are noisy: compare ratios.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { parseTrackFile } from '../../server/features/runs/parse/parse-track-file.ts';
import { analyseTrack } from '../../shared/tracks/analyse.ts';
import { generateLakeRun, longRunPhases, type SyntheticOptions } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';

type Approach = 'saxes' | 'fxp-tree';

interface CaseResult {
  file: string;
  approach: Approach;
  points: number;
  mib: number;
  parse_ms: number;
  analyse_ms: number | null;
  total_ms: number;
  peak_rss_growth_mb: number;
  heap_after_parse_mb: number;
}

/** The same runs as `npm run fixtures -- --large`: fixed start, seed and noise. */
const START_T = Date.UTC(2024, 8, 14, 6, 30, 0);
const ULTRA_SPEED_MPS = 1.6;
const FILES = [
  { file: 'bench-3h.gpx', hours: 3, speed: 3.2 },
  { file: 'bench-100mi.gpx', hours: Math.ceil(160934.4 / (ULTRA_SPEED_MPS * 3540)), speed: ULTRA_SPEED_MPS },
] as const;
const APPROACHES: readonly Approach[] = ['saxes', 'fxp-tree'];
const SAMPLE_INTERVAL_MS = 2;
const MB = 1024 * 1024;

/**
 * The parse runs synchronously and blocks this thread's timers, so RSS (one figure for the
 * whole process) is sampled from a worker thread into shared memory.
 */
const SAMPLER_SOURCE = `
const { workerData, parentPort } = require('node:worker_threads');
const peak = new Float64Array(workerData);
const sample = () => { const rss = process.memoryUsage.rss(); if (rss > peak[0]) peak[0] = rss; };
sample();
setInterval(sample, ${SAMPLE_INTERVAL_MS});
parentPort.postMessage('sampling');
`;

function collectGarbage(): void {
  if (!globalThis.gc) throw new Error('run with node --expose-gc (npm run bench does)');
  globalThis.gc();
  globalThis.gc();
}

async function startSampler(): Promise<{ peak: () => number; stop: () => Promise<number> }> {
  const shared = new SharedArrayBuffer(8);
  const peak = new Float64Array(shared);
  const worker = new Worker(SAMPLER_SOURCE, { eval: true, workerData: shared });
  await new Promise<void>((resolve, reject) => {
    worker.once('message', () => resolve());
    worker.once('error', reject);
  });
  return { peak: () => peak[0] ?? 0, stop: () => worker.terminate() };
}

function parseWithFastXmlParser(buffer: Buffer): number {
  const xml = buffer.toString('utf8');
  const valid = XMLValidator.validate(xml);
  if (valid !== true) throw new Error(valid.err.msg);
  const parser = new XMLParser({
    preserveOrder: true,
    removeNSPrefix: true,
    ignoreAttributes: false,
    attributeNamePrefix: '',
    parseTagValue: false,
    parseAttributeValue: false,
    processEntities: false,
    htmlEntities: false,
    trimValues: true,
    ignoreDeclaration: true,
    ignorePiTags: true,
  });
  const tree = parser.parse(xml) as unknown[];
  return tree.length;
}

/** One case in this process: parse, analyse, and the memory they took. */
async function measureCase(path: string, approach: Approach): Promise<CaseResult> {
  const buffer = readFileSync(path);
  // Compile the hot paths on a small run first, so the figures are not mostly JIT warm-up.
  const warmUp = Buffer.from(
    writeGpx('warm-up', [generateLakeRun({ start_t: START_T, phases: longRunPhases(0.2), seed: 1 }).points]),
  );
  if (approach === 'saxes') analyseTrack(parseTrackFile(warmUp)[0]!.track);
  else parseWithFastXmlParser(warmUp);

  const sampler = await startSampler();
  collectGarbage();
  const baseline = process.memoryUsage();
  const t0 = performance.now();
  let points = 0;
  let analyseMs: number | null = null;
  let heapAfterParse: number;
  if (approach === 'saxes') {
    const run = parseTrackFile(buffer)[0]!;
    const t1 = performance.now();
    heapAfterParse = process.memoryUsage().heapUsed;
    points = run.track.points.length;
    analyseTrack(run.track);
    analyseMs = performance.now() - t1;
  } else {
    parseWithFastXmlParser(buffer);
    heapAfterParse = process.memoryUsage().heapUsed;
  }
  const total = performance.now() - t0;
  const parseMs = total - (analyseMs ?? 0);
  await new Promise((resolve) => setTimeout(resolve, SAMPLE_INTERVAL_MS * 5));
  const peakRss = Math.max(sampler.peak(), process.memoryUsage.rss());
  await sampler.stop();
  return {
    file: path.slice(path.lastIndexOf('/') + 1),
    approach,
    points,
    mib: round(buffer.length / MB, 1),
    parse_ms: Math.round(parseMs),
    analyse_ms: analyseMs === null ? null : Math.round(analyseMs),
    total_ms: Math.round(total),
    peak_rss_growth_mb: Math.round((peakRss - baseline.rss) / MB),
    heap_after_parse_mb: Math.round((heapAfterParse - baseline.heapUsed) / MB),
  };
}

function round(value: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(value * f) / f;
}

function writeBenchFiles(dir: string): string[] {
  return FILES.map(({ file, hours, speed }) => {
    const options: SyntheticOptions = {
      start_t: START_T,
      phases: longRunPhases(hours, speed),
      seed: 3,
      gps_sigma_m: 1.5,
      ele_sigma_m: 1,
    };
    const path = join(dir, file);
    writeFileSync(path, writeGpx('Lake Tamsel long run', [generateLakeRun(options).points]));
    return path;
  });
}

function runChild(path: string, approach: Approach): CaseResult {
  const self = fileURLToPath(import.meta.url);
  const child = spawnSync(process.execPath, ['--expose-gc', '--import', 'tsx', self, '--case', approach, path], {
    encoding: 'utf8',
    maxBuffer: 1024 * 1024,
  });
  if (child.status !== 0) throw new Error(`bench case ${approach} ${path} failed:\n${child.stderr}`);
  return JSON.parse(child.stdout.trim().split('\n').pop() ?? '') as CaseResult;
}

function printTable(results: readonly CaseResult[]): void {
  const header = [
    'file',
    'approach',
    'points',
    'MiB',
    'parse ms',
    'analyse ms',
    'total ms',
    'peak RSS +MB',
    'heap after parse +MB',
  ];
  const rows = results.map((r) => [
    r.file,
    r.approach === 'saxes' ? 'saxes (import)' : 'fast-xml-parser tree (old, parse only)',
    r.approach === 'saxes' ? String(r.points) : '—',
    r.mib.toFixed(1),
    String(r.parse_ms),
    r.analyse_ms === null ? '—' : String(r.analyse_ms),
    String(r.total_ms),
    String(r.peak_rss_growth_mb),
    String(r.heap_after_parse_mb),
  ]);
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((row) => (row[i] ?? '').length)));
  const line = (cells: readonly string[]): string =>
    cells.map((c, i) => (i < 2 ? c.padEnd(widths[i] ?? 0) : c.padStart(widths[i] ?? 0))).join('  ');
  console.log(line(header));
  console.log(widths.map((w) => '-'.repeat(w)).join('  '));
  for (const row of rows) console.log(line(row));
}

async function main(): Promise<void> {
  const caseIndex = process.argv.indexOf('--case');
  if (caseIndex !== -1) {
    const approach = process.argv[caseIndex + 1] as Approach;
    const path = process.argv[caseIndex + 2] ?? '';
    console.log(JSON.stringify(await measureCase(path, approach)));
    return;
  }
  const dir = mkdtempSync(join(tmpdir(), 'pacewright-bench-'));
  try {
    const paths = writeBenchFiles(dir);
    const results = paths.flatMap((path) => APPROACHES.map((approach) => runChild(path, approach)));
    printTable(results);
    console.log(JSON.stringify({ bench: 'import', node: process.version, results }));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

await main();
