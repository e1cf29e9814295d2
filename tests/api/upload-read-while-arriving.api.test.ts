/**
 * Issue 19: an upload's first file is read while its bytes arrive (server/features/runs/parse/arriving.ts),
 * against the real app, pool and database. The job starts before the last byte; the stored run is the one the
 * same file gives when read after arrival; a client that goes away mid-file stops the job (no run, its thread
 * and memory back); a job waiting for bytes gives its thread back at once to another job, and after its stall
 * bound when the bytes stop; the file is then read after arrival as before.
 */
import { mkdtempSync } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import {
  arrivingJobsNow,
  configureComputePool,
  DEFAULT_COMPUTE_LIMITS,
  runComputeJob,
} from '../../server/features/compute/compute-pool.ts';
import { filesReadWhileArriving } from '../../server/features/runs/runs.service.ts';
import { arrivingBytesInMemory } from '../../server/features/runs/upload-to-disk.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { writeDocument } from '../bench/bench-files.ts';
import { waitUntil } from '../support/poll.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';
import { person } from '../support/test-world.ts';

/** A 1 h run at 1 s (3 601 points, about 0.8 MB): several lookaheads long. */
const FILE = Buffer.from(writeDocument('gpx', 1, 3.2));

let server: http.Server;
let url: string;
let app: ReturnType<typeof createApp>;

beforeAll(async () => {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-read-while-arriving-'));
  app = createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
  server = http.createServer(app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/runs`;
});

afterAll(async () => {
  await new Promise<void>((resolve) => server.close(() => resolve()));
});

afterEach(async () => {
  configureComputePool(DEFAULT_COMPUTE_LIMITS);
  await runComputeJob('warm-up', { kind: 'spin', ms: 0 });
}, 60_000);

interface OpenUpload {
  /** Sends the rest of the file and the end of the body. */
  finish(): void;
  /** The client goes away. */
  destroy(): void;
  answer: Promise<{ status: number; body: { imported?: { id: string }[]; rejected?: unknown[] } }>;
}

/** A multipart upload of `file` whose first `sent` bytes go at once; the rest waits for `finish`. */
function openUpload(auth: Record<string, string>, file: Buffer, sent: number): OpenUpload {
  const boundary = 'pacewright-arriving-test';
  const head = Buffer.from(
    `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="long.gpx"\r\nContent-Type: application/octet-stream\r\n\r\n`,
  );
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  const req = http.request(url, {
    method: 'POST',
    headers: {
      ...auth,
      'Content-Type': `multipart/form-data; boundary=${boundary}`,
      'Content-Length': String(head.length + file.length + tail.length),
    },
  });
  const answer = new Promise<{ status: number; body: never }>((resolve, reject) => {
    req.on('response', (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () =>
        resolve({ status: res.statusCode ?? 0, body: JSON.parse(Buffer.concat(chunks).toString('utf8')) as never }),
      );
    });
    req.on('error', reject);
  });
  req.write(head);
  req.write(file.subarray(0, sent));
  return {
    finish: () => {
      req.write(file.subarray(sent));
      req.end(tail);
    },
    destroy: () => req.destroy(),
    answer,
  };
}

/** A stored run's fields and splits, without what differs between two uploads (ids, owner, times of writing). */
async function storedRun(runId: string) {
  const run = (await db('runs').where({ id: runId }).first()) as unknown as Record<string, unknown>;
  const splits = (await db('run_splits').where({ run_id: runId }).orderBy(['unit', 'split_index'])) as unknown as Record<
    string,
    unknown
  >[];
  const without = (row: Record<string, unknown>, keys: string[]) =>
    Object.fromEntries(Object.entries(row).filter(([key]) => !keys.includes(key)));
  return {
    fields: without(run, ['id', 'user_id', 'source_file_id', 'created_at', 'updated_at']),
    splits: splits.map((split) => without(split, ['id', 'run_id'])),
  };
}

describe('POST /api/runs reads the first file while it arrives', () => {
  it('starts before the last byte and stores the very run the file gives when read after arrival', async () => {
    const streamed = await person(app, 'runner', 'Arriving Runner');
    const before = filesReadWhileArriving();
    const upload = openUpload(streamed.auth, FILE, Math.floor(FILE.length / 2));
    // The job has started while half the file is still to come.
    await waitUntil(() => arrivingJobsNow() === 1, 'the job reading the arriving file started');
    upload.finish();
    const answer = await upload.answer;
    expect(answer.status).toBe(201);
    expect(filesReadWhileArriving()).toBe(before + 1);
    await waitUntil(() => arrivingBytesInMemory() === 0 && arrivingJobsNow() === 0, 'memory and job given back');

    // The same bytes read after arrival (the path before issue 19's step), by another runner.
    configureComputePool({ readWhileArriving: false });
    const after = await person(app, 'runner', 'After Runner');
    const plain = openUpload(after.auth, FILE, FILE.length);
    plain.finish();
    const plainAnswer = await plain.answer;
    expect(plainAnswer.status).toBe(201);
    expect(filesReadWhileArriving()).toBe(before + 1);
    const one = await storedRun(answer.body.imported![0]!.id);
    const two = await storedRun(plainAnswer.body.imported![0]!.id);
    expect(one.splits.length).toBeGreaterThan(5);
    expect(one).toEqual(two);
  }, 120_000);

  it('a client that goes away mid-file stops the job: nothing stored, its thread and memory back', async () => {
    const runner = await person(app, 'runner', 'Gone Runner');
    const upload = openUpload(runner.auth, FILE, Math.floor(FILE.length / 3));
    upload.answer.catch(() => undefined);
    await waitUntil(() => arrivingJobsNow() === 1, 'the job reading the arriving file started');
    upload.destroy();
    await waitUntil(() => arrivingJobsNow() === 0 && arrivingBytesInMemory() === 0, 'job stopped, memory back');
    // The thread is free for the next job.
    await expect(runComputeJob('someone', { kind: 'spin', ms: 0 })).resolves.toEqual(expect.any(Number));
    expect(await db('source_files').where({ user_id: runner.id })).toHaveLength(0);
    expect(await db('runs').where({ user_id: runner.id })).toHaveLength(0);
  }, 120_000);

  it('a job waiting for bytes gives its thread to another job at once; the file is then read after arrival', async () => {
    configureComputePool({ threads: 1 });
    const runner = await person(app, 'runner', 'Slow Runner');
    const before = filesReadWhileArriving();
    const upload = openUpload(runner.auth, FILE, Math.floor(FILE.length / 2));
    await waitUntil(() => arrivingJobsNow() === 1, 'the job reading the arriving file started');
    // Another runner's job needs the only thread: it runs while the upload still waits for its bytes.
    await expect(runComputeJob('another-runner', { kind: 'spin', ms: 0 })).resolves.toEqual(expect.any(Number));
    expect(arrivingJobsNow()).toBe(0);
    upload.finish();
    const answer = await upload.answer;
    expect(answer.status).toBe(201);
    expect(filesReadWhileArriving()).toBe(before);
  }, 120_000);

  it('bytes that stop for the stall bound: the job gives its thread back, and the file is read once it has arrived', async () => {
    configureComputePool({ arrivalStallMs: 300 });
    const runner = await person(app, 'runner', 'Pausing Runner');
    const before = filesReadWhileArriving();
    const upload = openUpload(runner.auth, FILE, Math.floor(FILE.length / 2));
    await waitUntil(() => arrivingJobsNow() === 1, 'the job reading the arriving file started');
    await waitUntil(() => arrivingJobsNow() === 0, 'the job gave its thread back after the stall');
    upload.finish();
    const answer = await upload.answer;
    expect(answer.status).toBe(201);
    expect(filesReadWhileArriving()).toBe(before);
    await waitUntil(() => arrivingBytesInMemory() === 0, 'memory back');
  }, 120_000);
});
