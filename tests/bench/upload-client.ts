/**
 * The client of the bench's api-upload case (upload-case.ts), in its own process as a browser would
 * be: making and sending the multipart body never runs on the measured server's event loop, and its
 * CPU is not counted as the server's. Sends one file when asked and answers with its timings.
 *
 * Two ways to send (README, "The bench's client"): `http` (the default) builds the multipart body as a
 * browser does for a chosen file — a boundary, the part's headers, the file's bytes read from disk as
 * they are sent, the closing boundary, an exact Content-Length — and pipes it through node:http; `fetch`
 * is undici's fetch with FormData and openAsBlob (the client of sessions 7 and 8), kept for comparison.
 */
import { randomBytes } from 'node:crypto';
import { createReadStream, openAsBlob } from 'node:fs';
import { stat } from 'node:fs/promises';
import { request } from 'node:http';

export type UploadClientKind = 'http' | 'fetch';

export interface UploadClientRequest {
  base: string;
  token: string;
  path: string;
  name: string;
  /** How to send; `http` when absent. */
  client?: UploadClientKind;
}

export interface UploadClientReply {
  status: number;
  imported: number;
  problem: string | null;
  /** Request start and whole answer read, ms since the epoch (performance.timeOrigin + now: comparable across processes). */
  started_at: number;
  answered_at: number;
  /** Minor page faults of the client's process during the send (field 10 of /proc/self/stat; 0 elsewhere). */
  minor_faults: number;
}

const now = (): number => performance.timeOrigin + performance.now();

async function minorFaults(): Promise<number> {
  try {
    const { readFile } = await import('node:fs/promises');
    const stat = await readFile('/proc/self/stat', 'utf8');
    return Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[7]);
  } catch {
    return 0;
  }
}

interface Sent {
  status: number;
  body: string;
  startedAt: number;
}

/** undici fetch with FormData; the file is a Blob backed by the file on disk. */
async function sendWithFetch(ask: UploadClientRequest): Promise<Sent> {
  const form = new FormData();
  form.append('files', await openAsBlob(ask.path), ask.name);
  const startedAt = now();
  const response = await fetch(`${ask.base}/api/runs`, {
    method: 'POST',
    headers: { authorization: `Bearer ${ask.token}` },
    body: form,
  });
  return { status: response.status, body: await response.text(), startedAt };
}

/** node:http with a multipart body made as a browser makes it; the file is read from disk as it is sent. */
async function sendWithHttp(ask: UploadClientRequest): Promise<Sent> {
  const boundary = `----pacewright-bench-${randomBytes(12).toString('hex')}`;
  const head = Buffer.from(
    `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="${ask.name.replace(/"/g, '%22')}"\r\n` +
      // What a browser sends for a file type it has no name for; the server reads the bytes, not this.
      'Content-Type: application/octet-stream\r\n\r\n',
  );
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  const { size } = await stat(ask.path);
  const startedAt = now();
  return new Promise<Sent>((resolve, reject) => {
    const req = request(`${ask.base}/api/runs`, {
      method: 'POST',
      headers: {
        authorization: `Bearer ${ask.token}`,
        'content-type': `multipart/form-data; boundary=${boundary}`,
        'content-length': head.length + size + tail.length,
      },
    });
    req.once('error', reject);
    req.once('response', (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.once('error', reject);
      res.once('end', () => resolve({ status: res.statusCode ?? 0, body: Buffer.concat(chunks).toString('utf8'), startedAt }));
    });
    req.write(head);
    const file = createReadStream(ask.path, { highWaterMark: 256 * 1024 });
    file.once('error', (err) => req.destroy(err));
    file.once('end', () => req.end(tail));
    file.pipe(req, { end: false });
  });
}

process.on('message', (ask: UploadClientRequest) => {
  void (async () => {
    const faults0 = await minorFaults();
    const sent = await (ask.client === 'fetch' ? sendWithFetch(ask) : sendWithHttp(ask));
    const answeredAt = now();
    const faults = (await minorFaults()) - faults0;
    let imported = 0;
    try {
      imported = (JSON.parse(sent.body) as { imported?: unknown[] }).imported?.length ?? 0;
    } catch {
      // Not JSON: reported as the problem below.
    }
    process.send!({
      status: sent.status,
      imported,
      problem: sent.status === 201 ? null : sent.body.slice(0, 2000),
      started_at: sent.startedAt,
      answered_at: answeredAt,
      minor_faults: faults,
    } satisfies UploadClientReply);
  })();
});
