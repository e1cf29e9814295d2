/**
 * Issue 19, the upload's arrival: a request's files are kept in memory as they arrive (shared with the compute
 * threads, so the parse starts without reading the file back from disk) besides being written to disk and hashed.
 * The bytes in memory are exactly the bytes on disk, for every part of a request; a request without a declared
 * length keeps nothing in memory (the disk path alone, as before); whatever happens, the memory is given back
 * once the answer has gone. Memory given back is kept for the next upload (its first touch costs the event loop a
 * page fault per 4 KB), cleared: a later upload sees its own bytes and zeros, never an earlier upload's.
 */
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import express from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { errorHandler } from '../../server/lib/error-handler.ts';
import {
  arrivingBytesInMemory,
  idleArrivingMemoryBytes,
  receiveUploads,
  receivedFiles,
  removeReceivedFiles,
} from '../../server/features/runs/upload-to-disk.ts';
import { streamMultipart } from '../support/big-uploads.ts';
import { waitUntil } from '../support/poll.ts';

const KB = 1024;
const work = mkdtempSync(path.join(tmpdir(), 'pacewright-arrival-'));
const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

interface Seen {
  name: string;
  size: number;
  sha256: string;
  disk_sha256: string;
  memory_sha256: string | null;
  memory_shared: boolean;
  in_memory_while_handled: number;
  /** Every byte of the shared memory past the file is 0 (as in fresh memory). */
  memory_zero_past_file: boolean | null;
  /** Index of the shared memory among those the handler has seen (the same index: the same memory, reused). */
  memory_index: number | null;
}

const memoriesSeen: ArrayBufferLike[] = [];
function memoryIndex(memory: ArrayBufferLike): number {
  if (!memoriesSeen.includes(memory)) memoriesSeen.push(memory);
  return memoriesSeen.indexOf(memory);
}

let server: http.Server;
let url: string;

beforeAll(async () => {
  const app = express();
  app.post(
    '/upload',
    receiveUploads({
      tempDir: path.join(work, 'uploads'),
      maxFileBytes: 400 * KB,
      maxRequestBytes: 600 * KB,
      maxFiles: 4,
      storageLeft: () => undefined,
    }),
    async (req, res) => {
      const seen: Seen[] = receivedFiles(req).map((f) => ({
        name: f.name,
        size: f.size,
        sha256: f.sha256,
        disk_sha256: sha256(readFileSync(f.path)),
        memory_sha256: f.bytes ? sha256(f.bytes) : null,
        memory_shared: f.bytes?.buffer instanceof SharedArrayBuffer,
        in_memory_while_handled: arrivingBytesInMemory(),
        memory_zero_past_file: f.bytes ? new Uint8Array(f.bytes.buffer).subarray(f.size).every((b) => b === 0) : null,
        memory_index: f.bytes ? memoryIndex(f.bytes.buffer) : null,
      }));
      await removeReceivedFiles(req);
      res.json(seen);
    },
  );
  app.use(errorHandler);
  server = app.listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/upload`;
});

afterAll(async () => {
  await new Promise((resolve) => server.close(resolve));
  rmSync(work, { recursive: true, force: true });
});

/** `size` bytes that differ from one file to the next (and across the 64 KB chunks the server reads). */
function fileOf(name: string, size: number, seed: number): string {
  const file = path.join(work, name);
  writeFileSync(file, Buffer.from(Array.from({ length: size }, (_, k) => (k * 31 + seed * 7 + (k >> 10)) % 256)));
  return file;
}

describe('keeping an upload in memory as it arrives', () => {
  it('gives the first file of a request its exact bytes in shared memory (the same as on disk), the next ones disk only, and frees the memory once answered', async () => {
    const first = fileOf('first.gpx', 300 * KB + 17, 1);
    const second = fileOf('second.tcx', 150 * KB + 3, 2);
    const answer = await streamMultipart(url, {}, [
      { field: 'files', filename: 'first.gpx', path: first },
      { field: 'files', filename: 'second.tcx', path: second },
    ]);
    expect(answer.status).toBe(200);
    const seen = answer.body as Seen[];
    expect(seen.map((s) => [s.name, s.size])).toEqual([
      ['first.gpx', 300 * KB + 17],
      ['second.tcx', 150 * KB + 3],
    ]);
    const expected = [sha256(readFileSync(first)), sha256(readFileSync(second))];
    for (const [i, s] of seen.entries()) {
      expect(s.sha256).toBe(expected[i]);
      expect(s.disk_sha256).toBe(expected[i]);
      // The declared body, at most the per-file limit, was set aside while the request was handled.
      expect(s.in_memory_while_handled).toBe(400 * KB);
    }
    expect(seen[0]!.memory_sha256).toBe(expected[0]);
    expect(seen[0]!.memory_shared).toBe(true);
    expect(seen[1]!.memory_sha256).toBeNull();
    await waitUntil(() => arrivingBytesInMemory() === 0, 'the arriving bytes to be given back');
  });

  it("gives a finished upload's memory, cleared, to the next upload: its own bytes, zeros past them", async () => {
    const big = fileOf('big.gpx', 390 * KB, 3);
    const small = fileOf('small.gpx', 120 * KB + 5, 4);
    const first = await streamMultipart(url, {}, [{ field: 'files', filename: 'big.gpx', path: big }]);
    expect(first.status).toBe(200);
    await waitUntil(() => arrivingBytesInMemory() === 0, "the first upload's memory to be given back");
    expect(idleArrivingMemoryBytes()).toBeGreaterThanOrEqual(400 * KB);
    const second = await streamMultipart(url, {}, [{ field: 'files', filename: 'small.gpx', path: small }]);
    expect(second.status).toBe(200);
    const [a] = first.body as Seen[];
    const [b] = second.body as Seen[];
    // The same memory, now holding the small file's own bytes, and zeros where the big file's bytes were.
    expect(b!.memory_index).toBe(a!.memory_index);
    expect(b!.memory_sha256).toBe(sha256(readFileSync(small)));
    expect(a!.memory_zero_past_file).toBe(true);
    expect(b!.memory_zero_past_file).toBe(true);
    await waitUntil(() => arrivingBytesInMemory() === 0, "the second upload's memory to be given back");
  });

  it('keeps nothing in memory for a body of no declared length, and still receives it whole on disk', async () => {
    const file = fileOf('chunked.gpx', 200 * KB + 5, 3);
    const boundary = '----pacewright-arrival-chunked';
    const body = Buffer.concat([
      Buffer.from(
        `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="chunked.gpx"\r\nContent-Type: application/octet-stream\r\n\r\n`,
      ),
      readFileSync(file),
      Buffer.from(`\r\n--${boundary}--\r\n`),
    ]);
    const seen = await new Promise<Seen[]>((resolve, reject) => {
      // No Content-Length: node sends the body chunked.
      const req = http.request(url, { method: 'POST', headers: { 'Content-Type': `multipart/form-data; boundary=${boundary}` } });
      req.on('response', (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve(JSON.parse(Buffer.concat(chunks).toString('utf8')) as Seen[]));
      });
      req.on('error', reject);
      pipeline(Readable.from([body.subarray(0, 70_000), body.subarray(70_000)]), req).catch(reject);
    });
    expect(seen).toHaveLength(1);
    expect(seen[0]!.memory_sha256).toBeNull();
    expect(seen[0]!.disk_sha256).toBe(sha256(readFileSync(file)));
    expect(seen[0]!.sha256).toBe(seen[0]!.disk_sha256);
    expect(seen[0]!.in_memory_while_handled).toBe(0);
  });

  it('gives the memory back when the request is refused for its size part-way through', async () => {
    // Declared within the request limit's 64 KB grace (so it starts arriving) but past the limit itself.
    const file = fileOf('big.gpx', 390 * KB, 4);
    const other = fileOf('other.gpx', 250 * KB, 5);
    const answer = await streamMultipart(url, {}, [
      { field: 'files', filename: 'big.gpx', path: file },
      { field: 'files', filename: 'other.gpx', path: other },
    ]);
    expect(answer.status).toBe(413);
    expect((answer.body as { code: string }).code).toBe('too-large');
    await waitUntil(() => arrivingBytesInMemory() === 0, 'the arriving bytes of a refused upload to be given back');
  });
});
