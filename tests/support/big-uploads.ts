/**
 * Large uploads for the tests of issue 13, made and sent as streams so a test never holds a big
 * body in its own memory: long GPX tracks written point by point (optionally gzip-compressed) and
 * multipart requests fed from files or from a repeated chunk.
 */
import { createReadStream, createWriteStream, statSync } from 'node:fs';
import http from 'node:http';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import path from 'node:path';
import { createGzip, gzipSync } from 'node:zlib';

export interface LongTrackOptions {
  points: number;
  /** Seconds between points. */
  stepS: number;
  startMs: number;
  /** Turns the start of the loop, so two files of the same length differ. */
  seed?: number;
  name?: string;
  gzip?: boolean;
  /** Bytes of XML comment written before the points (a file that is mostly not track). */
  paddingBytes?: number;
}

const gpxHead = (name: string) =>
  `<?xml version="1.0" encoding="UTF-8"?>\n<gpx version="1.1" creator="Pacewright test" xmlns="http://www.topografix.com/GPX/1/1">\n<trk><name>${name}</name><type>running</type><trkseg>\n`;
const GPX_TAIL = '</trkseg></trk></gpx>\n';

/** Track points at about 3 m/s around a 600 m circle in open sea, a few thousand lines at a time. */
async function* trackPointLines(points: number, stepS: number, startMs: number, seed: number): AsyncGenerator<string> {
  const radiusM = 600;
  const speed = 3;
  const centre = { lat: 46.2, lon: -31.4 };
  const metresPerDegLat = 111_320;
  const metresPerDegLon = metresPerDegLat * Math.cos((centre.lat * Math.PI) / 180);
  const batch: string[] = [];
  for (let i = 0; i < points; i++) {
    const angle = seed + (i * stepS * speed) / radiusM;
    const lat = centre.lat + (radiusM * Math.sin(angle)) / metresPerDegLat;
    const lon = centre.lon + (radiusM * Math.cos(angle)) / metresPerDegLon;
    const time = new Date(startMs + i * stepS * 1000).toISOString().replace('.000Z', 'Z');
    batch.push(`<trkpt lat="${lat.toFixed(6)}" lon="${lon.toFixed(6)}"><ele>12.0</ele><time>${time}</time></trkpt>\n`);
    if (batch.length === 5000) {
      yield batch.join('');
      batch.length = 0;
    }
  }
  yield batch.join('');
}

/** A GPX 1.1 track (see `trackPointLines`), written straight to `file`; returns its size. */
export async function writeLongGpx(file: string, options: LongTrackOptions): Promise<number> {
  const { points, stepS, startMs, seed = 0, name = 'Long loop' } = options;
  async function* lines(): AsyncGenerator<string> {
    yield gpxHead(name);
    for (let left = options.paddingBytes ?? 0; left > 0; left -= 64 * 1024) {
      yield `<!--${'x'.repeat(Math.max(0, Math.min(64 * 1024, left) - 8))}-->\n`;
    }
    yield* trackPointLines(points, stepS, startMs, seed);
    yield GPX_TAIL;
  }
  const source = Readable.from(lines());
  if (options.gzip) await pipeline(source, createGzip({ level: 1 }), createWriteStream(file));
  else await pipeline(source, createWriteStream(file));
  return statSync(file).size;
}

export interface UploadPart {
  field: string;
  filename: string;
  /** A file to send, or `repeat` × `chunk` bytes made on the fly. */
  path?: string;
  chunk?: Buffer;
  repeat?: number;
}

export interface UploadAnswer {
  status: number;
  body: unknown;
  text: string;
}

function partSize(part: UploadPart): number {
  return part.path ? statSync(part.path).size : part.chunk!.length * part.repeat!;
}

async function* partBytes(part: UploadPart): AsyncGenerator<Buffer> {
  if (part.path) {
    yield* createReadStream(part.path, { highWaterMark: 256 * 1024 }) as AsyncIterable<Buffer>;
    return;
  }
  for (let i = 0; i < part.repeat!; i++) yield part.chunk!;
}

/**
 * POSTs a multipart/form-data body made of `parts`, streamed with back-pressure and an exact
 * Content-Length. Resolves with the answer once the server has answered and the body is sent.
 */
export function streamMultipart(url: string, headers: Record<string, string>, parts: UploadPart[]): Promise<UploadAnswer> {
  const boundary = `----pacewright-test-${Date.now().toString(16)}`;
  const heads = parts.map((p) =>
    Buffer.from(
      `--${boundary}\r\nContent-Disposition: form-data; name="${p.field}"; filename="${p.filename}"\r\nContent-Type: application/octet-stream\r\n\r\n`,
    ),
  );
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  const between = Buffer.from('\r\n');
  const length =
    heads.reduce((sum, h) => sum + h.length, 0) +
    parts.reduce((sum, p) => sum + partSize(p), 0) +
    between.length * (parts.length - 1) +
    tail.length;
  return new Promise<UploadAnswer>((resolve, reject) => {
    const req = http.request(url, {
      method: 'POST',
      headers: { ...headers, 'Content-Type': `multipart/form-data; boundary=${boundary}`, 'Content-Length': String(length) },
    });
    req.on('response', (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => {
        const text = Buffer.concat(chunks).toString('utf8');
        let body: unknown = null;
        try {
          body = JSON.parse(text);
        } catch {
          // not JSON
        }
        resolve({ status: res.statusCode ?? 0, body, text });
      });
    });
    req.on('error', reject);
    async function* body(): AsyncGenerator<Buffer> {
      for (let i = 0; i < parts.length; i++) {
        if (i > 0) yield between;
        yield heads[i]!;
        yield* partBytes(parts[i]!);
      }
      yield tail;
    }
    pipeline(Readable.from(body()), req).catch(reject);
  });
}

/**
 * An upload to `url` whose body starts arriving and then waits (64 KB of a declared 10 MB file): the
 * server holds it as arriving until the test destroys the returned request or the server goes away.
 */
export function uploadLeftOpen(url: string, headers: Record<string, string>): http.ClientRequest {
  const boundary = 'pacewright-open-upload';
  const req = http.request(url, {
    method: 'POST',
    headers: {
      ...headers,
      'Content-Type': `multipart/form-data; boundary=${boundary}`,
      'Content-Length': String(10 * 1024 * 1024),
    },
  });
  req.on('error', () => undefined); // destroyed by the test, or the server was stopped
  req.write(
    `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="slow.gpx"\r\nContent-Type: application/octet-stream\r\n\r\n`,
  );
  req.write(Buffer.alloc(64 * 1024, 0x20));
  return req;
}

/** Resident memory of a process, bytes (Linux /proc). */
export async function residentBytes(pid: number): Promise<number> {
  const { readFile } = await import('node:fs/promises');
  const status = await readFile(`/proc/${pid}/status`, 'utf8');
  const kb = /^VmRSS:\s+(\d+)\s+kB/m.exec(status)?.[1];
  if (!kb) throw new Error(`no VmRSS for process ${pid}`);
  return Number(kb) * 1024;
}

export interface HealthSample {
  /** When the ask started, ms after the work began. */
  at: number;
  ms: number;
  status: number;
  db: string | null;
}

/**
 * Asks `/api/health` every `everyMs` until `work` settles and records how long each answer took.
 * Each ask waits for its answer before the next, so a stalled server shows as one long sample.
 */
export async function healthWhile<T>(
  baseUrl: string,
  work: Promise<T>,
  everyMs = 50,
): Promise<{ result: T; samples: HealthSample[] }> {
  const samples: HealthSample[] = [];
  const begun = performance.now();
  let done = false;
  const settled = work.finally(() => {
    done = true;
  });
  const poll = (async () => {
    while (!done) {
      const started = performance.now();
      const res = await fetch(`${baseUrl}/api/health`);
      const body = (await res.json()) as { db?: string };
      samples.push({ at: started - begun, ms: performance.now() - started, status: res.status, db: body.db ?? null });
      await new Promise((resolve) => setTimeout(resolve, everyMs));
    }
  })();
  const result = await settled;
  await poll;
  return { result, samples };
}

/**
 * `count` different .gpx.gz files of `points` points each, cheaply: the points are compressed once
 * and each file is three gzip members (its own head naming it, the shared points, the tail), which
 * gunzip reads as one document. Returns the files' paths.
 */
export async function writeManyLongGpxGz(
  dir: string,
  count: number,
  options: Omit<LongTrackOptions, 'gzip' | 'name'>,
): Promise<string[]> {
  const body = path.join(dir, 'points.gz');
  await pipeline(
    Readable.from(trackPointLines(options.points, options.stepS, options.startMs, options.seed ?? 0)),
    createGzip({ level: 1 }),
    createWriteStream(body),
  );
  const files: string[] = [];
  for (let i = 0; i < count; i++) {
    const file = path.join(dir, `long-${i}.gpx.gz`);
    async function* members(): AsyncGenerator<Buffer> {
      yield gzipSync(gpxHead(`Long loop ${i + 1}`));
      yield* createReadStream(body) as AsyncIterable<Buffer>;
      yield gzipSync(GPX_TAIL);
    }
    await pipeline(Readable.from(members()), createWriteStream(file));
    files.push(file);
  }
  return files;
}
