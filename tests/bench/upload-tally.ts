/**
 * One upload of `npm run load` and its tally, shared by the 3-hour upload round (http-load.ts) and the 100-mile
 * upload driver (upload-driver.ts): the answer's status (or the client's socket error) counted, whether one run
 * was stored, and how long it took.
 *
 * Sent as a browser sends a file (LOAD_UPLOAD_CLIENT=http, the default; session 10): a multipart body with one
 * boundary, the part's headers, the bytes in 256 KB slices as the socket takes them, an exact Content-Length,
 * over node:http. LOAD_UPLOAD_CLIENT=fetch keeps undici's fetch with FormData (sessions 6–9), whose own CPU per
 * 25 MB send was several times a browser's (tests/bench/README.md, "The bench's client"): on this 2-core machine
 * that client competes with the server it measures, as a browser on another machine never does.
 */
import { randomBytes } from 'node:crypto';
import { request } from 'node:http';

/** Longest a single upload may take before the client gives up on it. */
export const UPLOAD_TIMEOUT_MS = 180_000;

const CLIENT = process.env.LOAD_UPLOAD_CLIENT === 'fetch' ? 'fetch' : 'http';
const SLICE_BYTES = 256 * 1024;

interface Answer {
  status: number;
  body: string;
}

async function sendWithFetch(url: string, token: string, file: Uint8Array<ArrayBuffer>, name: string): Promise<Answer> {
  const form = new FormData();
  form.append('files', new Blob([file], { type: 'application/gpx+xml' }), name);
  const response = await fetch(url, {
    method: 'POST',
    headers: { authorization: `Bearer ${token}` },
    body: form,
    signal: AbortSignal.timeout(UPLOAD_TIMEOUT_MS),
  });
  return { status: response.status, body: await response.text() };
}

function sendAsBrowser(url: string, token: string, file: Uint8Array, name: string): Promise<Answer> {
  const boundary = `----pacewright-load-${randomBytes(12).toString('hex')}`;
  const head = Buffer.from(
    `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="${name.replace(/"/g, '%22')}"\r\n` +
      'Content-Type: application/gpx+xml\r\n\r\n',
  );
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  return new Promise<Answer>((resolve, reject) => {
    const req = request(url, {
      method: 'POST',
      headers: {
        authorization: `Bearer ${token}`,
        'content-type': `multipart/form-data; boundary=${boundary}`,
        'content-length': head.length + file.length + tail.length,
      },
      signal: AbortSignal.timeout(UPLOAD_TIMEOUT_MS),
    });
    req.once('error', reject);
    req.once('response', (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.once('error', reject);
      res.once('end', () => resolve({ status: res.statusCode ?? 0, body: Buffer.concat(chunks).toString('utf8') }));
    });
    req.write(head);
    let at = 0;
    const sendMore = (): void => {
      while (at < file.length) {
        const slice = file.subarray(at, (at += SLICE_BYTES));
        if (!req.write(slice)) return void req.once('drain', sendMore);
      }
      req.end(tail);
    };
    sendMore();
  });
}

export class UploadTally {
  readonly statuses: Record<string, number> = {};
  readonly latencies: number[] = [];
  stored = 0;

  /** Sends one GPX file as `POST /api/runs` with the token and counts the outcome. */
  async upload(base: string, token: string, file: Uint8Array<ArrayBuffer> | string, name: string): Promise<void> {
    const bytes = typeof file === 'string' ? new Uint8Array(Buffer.from(file)) : file;
    const started = performance.now();
    try {
      const url = `${base}/api/runs`;
      const answer = await (CLIENT === 'fetch' ? sendWithFetch(url, token, bytes, name) : sendAsBrowser(url, token, bytes, name));
      const body = JSON.parse(answer.body) as { imported?: unknown[] };
      this.count(String(answer.status));
      if (answer.status === 201 && body.imported?.length === 1) this.stored++;
    } catch (error) {
      // fetch's TypeError says only "fetch failed"; its cause names the socket error. node:http's error has the code.
      const cause =
        error instanceof Error ? ((error.cause ?? error) as { code?: string; message?: string } | undefined) : undefined;
      this.count(error instanceof Error ? `${error.name}${cause ? ` (${cause.code ?? cause.message})` : ''}` : 'error');
    }
    this.latencies.push(performance.now() - started);
  }

  /** Median and slowest upload (ms), rounded. */
  spread(): { p50_ms: number; max_ms: number } {
    const sorted = [...this.latencies].sort((a, b) => a - b);
    return {
      p50_ms: Math.round(sorted[Math.floor(sorted.length / 2)] ?? 0),
      max_ms: Math.round(sorted[sorted.length - 1] ?? 0),
    };
  }

  private count(key: string): void {
    this.statuses[key] = (this.statuses[key] ?? 0) + 1;
  }
}
