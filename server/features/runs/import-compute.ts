import { readFile } from 'node:fs/promises';
import type { MessagePort } from 'node:worker_threads';
import { Readable } from 'node:stream';
import { createGunzip } from 'node:zlib';
import { MAX_TRACK_POINTS, tooManyPointsReason } from '../../../shared/runs/upload-limits.ts';
import { analyseTrack } from '../../../shared/tracks/analyse.ts';
import { lapCoverageProblem } from '../../../shared/tracks/lap-coverage.ts';
import { MAX_DOCUMENT_BYTES, type TrackFormat } from './parse/detect.ts';
import { ImportRejection } from './parse/import-rejection.ts';
import { ArrivalStopped, SharedArrival, type ArrivalWaitLimits } from './parse/arriving.ts';
import { parseArrivingTrackFile, parseTrackFile, type ParsedRun } from './parse/parse-track-file.ts';
import { buildRunRecord, packedTrack, type RunOwnerProfile, type RunRecord, type StoredTrack } from './run-record.ts';

/**
 * One file to turn into runs: a file on disk (a streamed upload), bytes (an archive entry, or an upload
 * that has arrived in memory), or an upload's first file still arriving in shared memory (parse/arriving.ts).
 */
export interface ImportComputeInput {
  source:
    | { path: string }
    | { data: Uint8Array }
    | { arriving: { memory: SharedArrayBuffer; control: SharedArrayBuffer; limits?: ArrivalWaitLimits } };
  owner: RunOwnerProfile;
  /**
   * Where to send a file of one run's track as soon as its series is built (a `HandedOverTrack`, its bytes moved,
   * not copied), before the rest of the analysis: the event loop stores it meanwhile (runs.service.ts). The record
   * in the answer then carries the track's names without its bytes (`handed_over`).
   */
  handOver?: MessagePort;
}

/** A track sent ahead of the answer (`ImportComputeInput.handOver`), with what the same-run check needs of its run. */
export interface HandedOverTrack {
  format: TrackFormat;
  activity_index: number;
  /** The run's start as its row will hold it (ms of a Date): summarizeRun's first time of the series. */
  started_at_t: number;
  /** The run's distance: summarizeRun's last distance of the series. */
  distance_m: number;
  track: StoredTrack;
}

export type ImportComputeOutput =
  { ok: true; format: TrackFormat; records: RunRecord[] } | { ok: false; code: string; message: string };

/**
 * The answer of a job that did not read its arriving file (gzip or UTF-16, bytes stopped or too slow, its
 * thread needed elsewhere): the file is to be read after it has arrived, the usual way. Never a refusal.
 */
export const NOT_READ_WHILE_ARRIVING = 'not-read-while-arriving';

const POINT_TAGS = [Buffer.from('<trkpt'), Buffer.from('<Trackpoint')];
/** Bytes a tag may straddle between two chunks. */
const OVERLAP = 16;

function countOpeningTags(chunk: Buffer): number {
  let count = 0;
  for (const tag of POINT_TAGS) {
    for (let at = chunk.indexOf(tag); at !== -1; at = chunk.indexOf(tag, at + tag.length)) {
      const after = chunk[at + tag.length];
      // `<trkpt ` or `<trkpt>`, never a longer name.
      if (after === 0x20 || after === 0x3e || after === 0x2f || after === 0x09 || after === 0x0a || after === 0x0d) count++;
    }
  }
  return count;
}

/**
 * True once the gzip-compressed file shows more than MAX_TRACK_POINTS point tags, found while it is
 * decompressed a chunk at a time: a file of a million points is refused after reading a fraction
 * of it, never decompressed whole. Unprefixed tags only, so it never over-counts; the parser counts
 * again, exactly, for whatever passes here.
 */
async function compressedShowsTooManyPoints(data: Buffer): Promise<boolean> {
  const chunks: AsyncIterable<Buffer> = Readable.from([data]).pipe(createGunzip({ chunkSize: 1024 * 1024 }));
  let count = 0;
  let tail = Buffer.alloc(0);
  let read = 0;
  try {
    for await (const chunk of chunks) {
      read += chunk.length;
      const window = Buffer.concat([tail, chunk]);
      // Tags wholly inside the overlap were counted with the previous chunk.
      count += countOpeningTags(window) - countOpeningTags(tail);
      if (count > MAX_TRACK_POINTS) return true;
      if (read > MAX_DOCUMENT_BYTES) return false; // the parser refuses it for its size
      tail = window.subarray(Math.max(0, window.length - OVERLAP));
    }
  } catch {
    return false; // a damaged gzip stream: the parser says so in words
  }
  return false;
}

/**
 * Reads, parses, checks the limits of (shared/runs/upload-limits.ts), analyses and builds the rows
 * of one file. The CPU-heavy half of an import: it runs in a compute worker, never on the event loop.
 * A file that cannot become a run answers `ok: false` with a sentence (an ImportRejection does not
 * survive the trip between threads as its own class).
 */
export async function computeImport(input: ImportComputeInput): Promise<ImportComputeOutput> {
  const { source } = input;
  if ('arriving' in source) {
    let parsed: ParsedRun[] | null;
    try {
      const { memory, control, limits } = source.arriving;
      parsed = parseArrivingTrackFile(new SharedArrival(memory, control, limits));
    } catch (err) {
      if (err instanceof ArrivalStopped) return { ok: false, code: NOT_READ_WHILE_ARRIVING, message: err.reason };
      if (err instanceof ImportRejection) return { ok: false, code: err.code, message: err.message };
      throw err;
    }
    if (parsed === null) return { ok: false, code: NOT_READ_WHILE_ARRIVING, message: 'read after arrival' };
    return analysedRuns(input, parsed);
  }
  const data =
    'path' in source
      ? await readFile(source.path)
      : Buffer.from(source.data.buffer, source.data.byteOffset, source.data.byteLength);
  // A plain file is counted exactly by parseTrackFile while it is read (parse/point-tags.ts); only a
  // compressed one needs counting while it is decompressed, so a zip bomb of points is never inflated whole.
  const gzipped = data[0] === 0x1f && data[1] === 0x8b;
  if (gzipped && (await compressedShowsTooManyPoints(data))) {
    return { ok: false, code: 'too-many-points', message: tooManyPointsReason(MAX_TRACK_POINTS + 1)! };
  }
  let parsed: ParsedRun[];
  try {
    parsed = parseTrackFile(data);
  } catch (err) {
    if (err instanceof ImportRejection) return { ok: false, code: err.code, message: err.message };
    throw err;
  }
  return analysedRuns(input, parsed);
}

/** Analyses the runs read from a file and builds their rows; a track its own laps contradict is refused. */
function analysedRuns(input: ImportComputeInput, parsed: ParsedRun[]): ImportComputeOutput {
  try {
    // A file of one run hands its track over once the series exists (the rest of the analysis takes a
    // fifth to two fifths of it more: splits, fastest sections, summary); several runs are stored after.
    const port = parsed.length === 1 ? input.handOver : undefined;
    let handedOver: StoredTrack | undefined;
    const analyses = parsed.map((p) =>
      analyseTrack(p.track, port ? (series) => (handedOver = handOverTrack(port, p, series)) : undefined),
    );
    // A track that cannot be what its own laps record is refused whole: nothing half-imported.
    parsed.forEach((p, i) => {
      const problem = lapCoverageProblem(analyses[i]!.summary, p.laps, p.track.report);
      if (problem) throw new ImportRejection('track-not-laps', parsed.length > 1 ? `Activity ${i + 1}: ${problem}` : problem);
    });
    return {
      ok: true,
      format: parsed[0]!.format,
      records: parsed.map((p, i) => buildRunRecord(input.owner, p, analyses[i]!, handedOver)),
    };
  } catch (err) {
    if (err instanceof ImportRejection) return { ok: false, code: err.code, message: err.message };
    throw err;
  }
}

/** Sends the run's packed track (moved) with its start and distance, as summarizeRun will give them; undefined for no points. */
function handOverTrack(port: MessagePort, parsed: ParsedRun, series: Parameters<typeof packedTrack>[1]): StoredTrack | undefined {
  const n = series.t.length;
  if (n === 0) return undefined;
  const track = packedTrack(parsed, series);
  const message: HandedOverTrack = {
    format: parsed.format,
    activity_index: parsed.activity_index,
    started_at_t: new Date(series.t[0]!).getTime(),
    distance_m: series.d[n - 1]!,
    track,
  };
  port.postMessage(message, [track.raw.buffer as ArrayBuffer]);
  return track;
}
