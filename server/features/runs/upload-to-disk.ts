import { createHash, randomUUID } from 'node:crypto';
import { createWriteStream, type WriteStream } from 'node:fs';
import { mkdir, rm } from 'node:fs/promises';
import path from 'node:path';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Request, RequestHandler } from 'express';
import multer, { type StorageEngine } from 'multer';
import { storageFullReason, uploadDoesNotFitReason } from '../../../shared/runs/upload-limits.ts';
import { formatFileSize } from '../../../shared/units.ts';
import { AppError, BadRequestError } from '../../lib/errors.ts';
import { logger } from '../../lib/logger.ts';
import { multipartTextProblem } from '../../lib/validate.ts';
import { ArrivalWriter, newArrivalControl } from './parse/arriving.ts';

/**
 * An uploaded file as it waits on disk for the import: where, how big, and its SHA-256 (taken while it arrived);
 * `bytes` are the same bytes in memory shared with the compute threads, when the request had room for them
 * (see `ArrivingBytes`), so the parse starts without reading the file back from disk.
 */
export interface ReceivedFile {
  name: string;
  path: string;
  size: number;
  sha256: string;
  bytes?: Uint8Array;
  /**
   * Keeps `bytes`' memory counted against the process's allowance until the returned function is called
   * (a compute job reading them): the allowance is handed back when the answer has gone AND every holder is done.
   */
  holdBytes?: () => () => void;
  /** What `ReceiveLimits.onArriving` started for this file while it arrived (a job reading it), if anything. */
  early?: Promise<unknown>;
}

/**
 * Bytes of arriving uploads the process keeps in memory at once (besides writing them to disk): above it a
 * request's files are only written to disk and read back by the compute thread, as before. 192 MB is three
 * requests of the 64 MB file limit; the limits themselves are unchanged.
 */
export const ARRIVING_IN_MEMORY_BYTES = 192 * 1024 * 1024;
let arrivingInMemory = 0;

/**
 * Shared memory of finished uploads kept for the next ones (at most 3 buffers and 96 MB, the smallest that
 * fits is taken). The first write to fresh memory costs this machine a page fault per 4 KB: 74–104 ms of the
 * event loop's CPU for a 100-mile file, against 9 ms to clear and fill memory already touched (session 10,
 * tests/bench/README.md "Session 10: reads before imports"), and the event loop answering reads pays it.
 * A buffer is kept only once its answer was sent whole and every job reading it is done, and is cleared when
 * taken: a job sees zeros beyond what has arrived, as in fresh memory, never another upload's bytes.
 */
const IDLE_ARRIVING_BUFFERS = 3;
const IDLE_ARRIVING_BYTES = 96 * 1024 * 1024;
const MB = 1024 * 1024;
const idleMemory: SharedArrayBuffer[] = [];

function takeArrivingMemory(bytes: number): SharedArrayBuffer {
  let best = -1;
  for (let k = 0; k < idleMemory.length; k++) {
    const size = idleMemory[k]!.byteLength;
    // At most twice the need (plus a megabyte): clearing it stays a few ms, and big buffers wait for big files.
    if (size >= bytes && size <= 2 * bytes + MB && (best === -1 || size < idleMemory[best]!.byteLength)) best = k;
  }
  if (best === -1) return new SharedArrayBuffer(Math.ceil(bytes / MB) * MB);
  const [memory] = idleMemory.splice(best, 1);
  // All of it, as fresh memory is: the reader may look a little past what has arrived.
  new Uint8Array(memory!).fill(0);
  return memory!;
}

function keepIdleArrivingMemory(memory: SharedArrayBuffer): void {
  if (memory.byteLength > IDLE_ARRIVING_BYTES) return;
  idleMemory.push(memory);
  let kept = idleMemory.reduce((sum, m) => sum + m.byteLength, 0);
  // The oldest go first.
  while (idleMemory.length > IDLE_ARRIVING_BUFFERS || kept > IDLE_ARRIVING_BYTES) kept -= idleMemory.shift()!.byteLength;
}

/** Shared memory kept for the next uploads now, bytes (tests). */
export function idleArrivingMemoryBytes(): number {
  return idleMemory.reduce((sum, m) => sum + m.byteLength, 0);
}

/**
 * The first file of a request kept in memory as it arrives: one SharedArrayBuffer sized by the request's
 * declared Content-Length (already checked against the request limit; a part is a slice of the body, so it
 * always fits), at most the per-file limit. Shared memory: the compute thread reads it without a copy. Only the first file: the parts of a
 * request flow through their own streams, so a second part's bytes could arrive before the first's have all
 * passed; the page sends one file per request, and further files of a request are read back from disk as before.
 */
interface ArrivingBytes {
  /** At least `limit` bytes (memory kept from an earlier upload may be longer). */
  memory: SharedArrayBuffer;
  /** The most of the file this memory takes: the declared body, at most the per-file limit. */
  limit: number;
  /** Taken by the request's first file part. */
  taken: boolean;
  /** Counts one more user of the memory (a compute job); the function ends that use. */
  hold: () => () => void;
}

/** Bytes of arriving uploads held in memory now (tests). */
export function arrivingBytesInMemory(): number {
  return arrivingInMemory;
}

/** Where uploads wait while their request is handled: `DATA_DIR/uploads/upload-<uuid>.part`. */
export function uploadsTempDir(dataDir: string): string {
  return path.join(dataDir, 'uploads');
}

export interface ReceiveLimits {
  tempDir: string;
  maxFileBytes: number;
  maxRequestBytes: number;
  maxFiles: number;
  /** Bytes this user may still store (quota minus what they keep), read before the body. */
  storageLeft: (req: Request) => { left: number; used: number; quota: number } | undefined;
  /**
   * Called when the request's first file starts arriving in memory (after the guards and the limits that run
   * before the body): `memory` receives its bytes as they come and `control` says how many have (see
   * parse/arriving.ts; `writer` is this side of it). May start a job reading it; what it gives is the file's `early`.
   */
  onArriving?: (
    req: Request,
    arriving: { memory: SharedArrayBuffer; control: SharedArrayBuffer },
    writer: ArrivalWriter,
  ) => Promise<unknown> | undefined;
}

const RECEIVED = Symbol('received bytes');
const ARRIVING = Symbol('arriving bytes');
type CountedRequest = Request & { [RECEIVED]?: number; [ARRIVING]?: ArrivingBytes };

/**
 * Keeps the request's body in memory as it arrives when its declared length fits the process's budget. The
 * budget is handed back when the answer has gone and every compute job reading the memory is done (a job may
 * outlive the answer: a client that goes away does not stop a thread that reads its bytes at once).
 */
function keepArrivingInMemory(req: Request, res: Parameters<RequestHandler>[1], declared: number, maxFileBytes: number): void {
  if (!Number.isSafeInteger(declared) || declared <= 0) return;
  // One file is kept, and no file passes the per-file limit.
  const bytes = Math.min(declared, maxFileBytes);
  if (arrivingInMemory + bytes > ARRIVING_IN_MEMORY_BYTES) return;
  arrivingInMemory += bytes;
  const memory = takeArrivingMemory(bytes);
  /** The answer, and each job reading the memory. */
  let users = 1;
  /**
   * The answer was sent whole: the handler is done with the file, so once no job reads the memory either it goes
   * to the next upload (and is never held again). A client gone before its answer leaves the memory to the
   * garbage collector instead, since its handler may still start a job reading it.
   */
  let answered = false;
  let given = false;
  const release = (): void => {
    if (--users > 0) return;
    arrivingInMemory -= bytes;
    if (answered && !given) {
      given = true;
      keepIdleArrivingMemory(memory);
    }
  };
  const hold = (): (() => void) => {
    if (given) throw new Error('an upload held its arriving memory after its answer had gone');
    // Held again after everyone let go (a job started after the client went away): counted again.
    if (users++ === 0) arrivingInMemory += bytes;
    let done = false;
    return () => {
      if (done) return;
      done = true;
      release();
    };
  };
  res.once('finish', () => {
    answered = true;
  });
  (req as CountedRequest)[ARRIVING] = { memory, limit: bytes, taken: false, hold };
  res.once('close', () => {
    release();
    delete (req as CountedRequest)[ARRIVING];
  });
}

export class RequestTooLargeError extends AppError {
  constructor(maxBytes: number) {
    super(
      413,
      'too-large',
      `One upload can carry at most ${formatFileSize(maxBytes)} of files. Send fewer files at a time, or compress them as .gpx.gz or .tcx.gz.`,
    );
  }
}

export class StorageFullError extends AppError {
  constructor(usedBytes: number, quotaBytes: number) {
    const reason =
      usedBytes >= quotaBytes ? storageFullReason(usedBytes, quotaBytes) : uploadDoesNotFitReason(usedBytes, quotaBytes);
    super(413, 'storage-full', reason, { used_bytes: usedBytes, quota_bytes: quotaBytes });
  }
}

/**
 * A multer storage engine that streams each file to a temporary file, counting the request's bytes
 * (and the user's storage left) as they arrive and hashing them on the way, so nothing of an upload
 * is ever held in memory whole. A limit crossed stops the upload there; multer removes what was written.
 */
function diskWithLimits(limits: ReceiveLimits): StorageEngine {
  return {
    _handleFile(req, file, callback) {
      const counted = req as CountedRequest;
      const target = path.join(limits.tempDir, `upload-${randomUUID()}.part`);
      const hash = createHash('sha256');
      const storage = limits.storageLeft(req);
      let size = 0;
      // The first file's bytes in the request's shared memory; dropped if they ever would not fit.
      let arriving = counted[ARRIVING]?.taken === false ? counted[ARRIVING] : undefined;
      if (arriving) arriving.taken = true;
      // A job may read the file as it arrives; the writer tells it how far the bytes have come.
      let writer: ArrivalWriter | undefined;
      let early: Promise<unknown> | undefined;
      if (arriving && limits.onArriving) {
        const control = newArrivalControl();
        writer = new ArrivalWriter(control);
        const letGo = arriving.hold();
        early = limits.onArriving(req, { memory: arriving.memory, control }, writer);
        if (early) {
          // The memory stays counted until the job is done with it, whatever the request does meanwhile.
          early.then(letGo, letGo);
          // The client going away, or anything ending the request before the file is whole, stops the job.
          const stop = writer;
          req.res?.once('close', () => stop.stop());
        } else {
          letGo();
          writer = undefined;
        }
      }
      const counter = new Transform({
        transform(chunk: Buffer, _encoding, done) {
          size += chunk.length;
          counted[RECEIVED] = (counted[RECEIVED] ?? 0) + chunk.length;
          if (counted[RECEIVED] > limits.maxRequestBytes) return done(new RequestTooLargeError(limits.maxRequestBytes));
          if (storage && counted[RECEIVED] > storage.left) return done(new StorageFullError(storage.used, storage.quota));
          hash.update(chunk);
          if (arriving && size <= arriving.limit) {
            new Uint8Array(arriving.memory, size - chunk.length, chunk.length).set(chunk);
            writer?.arrived(size);
          } else {
            arriving = undefined;
            // Larger than the memory: read from disk after arrival instead.
            writer?.stop();
          }
          done(null, chunk);
        },
      });
      // The part is read through `counter` without handing multer's own stream to `pipeline`: a limit crossed here
      // must not error that stream, or multer would answer before this file is removed.
      let out: WriteStream | undefined;
      mkdir(limits.tempDir, { recursive: true })
        .then(() => {
          file.stream.once('error', (err) => counter.destroy(err));
          file.stream.pipe(counter);
          return pipeline(counter, (out = createWriteStream(target)));
        })
        .then(
          () => {
            writer?.complete(size);
            callback(null, {
              path: target,
              size,
              sha256: hash.digest('hex'),
              bytes: arriving ? new Uint8Array(arriving.memory, 0, size) : undefined,
              holdBytes: arriving?.hold,
              early,
            } as Partial<Express.Multer.File>);
          },
          async (err: unknown) => {
            writer?.stop();
            // A stream stopped while still opening creates its file afterwards: remove it only once closed.
            if (out && !out.closed) await new Promise<void>((resolve) => out!.once('close', () => resolve()));
            await rm(target, { force: true });
            // The rest of this part is read and dropped by busboy; multer then drains the request.
            file.stream.resume();
            callback(err as Error);
          },
        );
    },
    _removeFile(_req, file, callback) {
      rm(file.path, { force: true }).then(
        () => callback(null),
        (err: Error) => callback(err),
      );
    },
  };
}

/** Removes the temporary files of a request now; safe to call twice. */
export async function removeReceivedFiles(req: Request): Promise<void> {
  const files = (req.files as Express.Multer.File[] | undefined) ?? [];
  await Promise.all(
    files.map((file) =>
      rm(file.path, { force: true }).catch((err: unknown) => logger.warn({ err, file: file.path }, 'removing an upload failed')),
    ),
  );
}

/** Removes a request's temporary files once its answer has gone (or the client went away), whatever happened before. */
function removeWhenDone(req: Request, res: Parameters<RequestHandler>[1]): void {
  res.once('close', () => void removeReceivedFiles(req));
}

/**
 * Receives the multipart parts named "files" onto disk with per-file, per-request and storage
 * limits, as `req.files` (ReceivedFile-shaped, see `receivedFiles`). Errors become the JSON errors
 * of api-contract.md (413 for sizes). Runs only after the caller was let in (see upload-guards.ts).
 */
export function receiveUploads(limits: ReceiveLimits): RequestHandler {
  const upload = multer({
    storage: diskWithLimits(limits),
    limits: { fileSize: limits.maxFileBytes, files: limits.maxFiles, fields: 10, fieldSize: 4096, parts: limits.maxFiles + 10 },
  }).array('files', limits.maxFiles);
  return (req, res, next) => {
    const declared = Number(req.get('content-length'));
    // A body announced larger than the limit is refused before a byte of it is read.
    if (Number.isFinite(declared) && declared > limits.maxRequestBytes + 64 * 1024) {
      return next(new RequestTooLargeError(limits.maxRequestBytes));
    }
    removeWhenDone(req, res);
    keepArrivingInMemory(req, res, declared, limits.maxFileBytes);
    upload(req, res, (err: unknown) => {
      if (!err) {
        const problem = multipartTextProblem(req, 'files');
        if (!problem) return next();
        // Refused whole, and nothing of it kept.
        return void removeReceivedFiles(req).then(() => next(problem));
      }
      if (err instanceof AppError) return next(err);
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE')
          return next(
            new AppError(
              413,
              'too-large',
              `Each file can be at most ${formatFileSize(limits.maxFileBytes)}. Compress it as .gpx.gz or .tcx.gz, or split it.`,
            ),
          );
        if (err.code === 'LIMIT_FILE_COUNT' || err.code === 'LIMIT_PART_COUNT')
          return next(
            new AppError(
              413,
              'too-many-files',
              `Upload at most ${limits.maxFiles} files at once; for a whole history use the bulk import.`,
            ),
          );
        if (err.code === 'LIMIT_UNEXPECTED_FILE')
          return next(new BadRequestError('Send the files in form fields named "files".'));
        return next(new BadRequestError('The upload could not be read. Please try again.'));
      }
      next(new BadRequestError('The upload could not be read. Please send the files as multipart/form-data.'));
    });
  };
}

/** The files `receiveUploads` put on disk, with names decoded as browsers send them. */
export function receivedFiles(req: Request): ReceivedFile[] {
  type Received = Express.Multer.File & Pick<ReceivedFile, 'sha256' | 'bytes' | 'holdBytes' | 'early'>;
  return ((req.files as Received[] | undefined) ?? []).map((f) => ({
    // multer decodes names as latin1; browsers send UTF-8.
    name: Buffer.from(f.originalname, 'latin1').toString('utf8'),
    path: f.path,
    size: f.size,
    sha256: f.sha256,
    bytes: f.bytes,
    holdBytes: f.holdBytes,
    early: f.early,
  }));
}
