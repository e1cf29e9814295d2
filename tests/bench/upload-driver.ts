/**
 * The uploading side of `npm run load`'s "reads during uploads" rounds, in its own process
 * (http-load.ts forks it), so making and sending 25 MB files never runs on the event loop of the
 * server being measured.
 *
 * It writes one 100-mile run (30 h, one point a second, 108 001 points, 24.7 MB of GPX, the same
 * run as `npm run bench`'s 30 h GPX) once, then makes each upload a different file by writing
 * another year into every `<time>`: the import refuses a file it already holds (same bytes) and a
 * second file of the same run (same times), and this keeps every upload a real, stored import.
 *
 * Messages (process.send): in `{ type: 'start', base, tokens }` → out `{ type: 'started' }`; each
 * token then uploads one file at a time, again and again; in `{ type: 'stop' }` → no new uploads,
 * and once those under way are answered, out `{ type: 'stopped', result }`.
 */
import { generateLakeRun, longRunPhases } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { UploadTally } from './upload-tally.ts';

export interface UploadDriverResult {
  /** Uploads answered (any status) while the round ran. */
  uploads: number;
  stored: number;
  statuses: Record<string, number>;
  p50_ms: number;
  max_ms: number;
  file_mb: number;
}

export type UploadDriverMessage = { type: 'start'; base: string; tokens: string[] } | { type: 'stop' };
export type UploadDriverReply = { type: 'ready' } | { type: 'started' } | { type: 'stopped'; result: UploadDriverResult };

const START_T = Date.UTC(2024, 8, 14, 6, 30, 0);

// The bench's 30 h GPX (import-bench.ts writeDocument, same seed and noise).
const { points } = generateLakeRun({
  start_t: START_T,
  phases: longRunPhases(30, 1.6),
  seed: 3,
  gps_sigma_m: 1.5,
  ele_sigma_m: 1,
});
const template = Buffer.from(writeGpx('Load 100-mile upload', [points]));
const yearOffsets: number[] = [];
const TIME_TAG = Buffer.from('<time>2024-');
for (let at = template.indexOf(TIME_TAG); at !== -1; at = template.indexOf(TIME_TAG, at + TIME_TAG.length)) {
  yearOffsets.push(at + '<time>'.length);
}

/**
 * The template with every timestamp moved to `year` (same month, day and time), written into `into` (an uploader's
 * own copy, reused from one upload to the next: a fresh 25 MB copy per upload cost this process ~80 ms of first-touch
 * page faults each time, on the machine the server is measured on).
 */
function fileOfYear(year: number, into: Uint8Array<ArrayBuffer>): Uint8Array<ArrayBuffer> {
  const digits = Buffer.from(String(year));
  for (const at of yearOffsets) into.set(digits, at);
  return into;
}

let stopping = false;
let tally = new UploadTally();

async function uploadLoop(base: string, token: string): Promise<void> {
  // A fresh account per uploader: years 2023, 2022, … keep each of its files a different run.
  const file = new Uint8Array(template.length);
  file.set(template);
  // Each upload is answered before the next is written, so the one copy is never changed while it is sent.
  for (let year = 2023; !stopping && year > 1900; year--)
    await tally.upload(base, token, fileOfYear(year, file), `100-mile-${year}.gpx`);
}

let loops: Promise<void>[] = [];

process.on('message', (message: UploadDriverMessage) => {
  if (message.type === 'start') {
    stopping = false;
    tally = new UploadTally();
    loops = message.tokens.map((token) => uploadLoop(message.base, token));
    process.send!({ type: 'started' } satisfies UploadDriverReply);
  } else if (message.type === 'stop') {
    stopping = true;
    void Promise.all(loops).then(() => {
      const result: UploadDriverResult = {
        uploads: tally.latencies.length,
        stored: tally.stored,
        statuses: { ...tally.statuses },
        ...tally.spread(),
        file_mb: Math.round((template.length / 1024 / 1024) * 10) / 10,
      };
      process.send!({ type: 'stopped', result } satisfies UploadDriverReply);
    });
  }
});
process.on('disconnect', () => process.exit(0));
process.send!({ type: 'ready' } satisfies UploadDriverReply);
