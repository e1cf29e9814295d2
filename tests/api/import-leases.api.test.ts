import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { stopImportSender } from '../../server/features/history/import-queue.ts';
import { claimFile, completeFile } from '../../server/features/history/imports.repository.ts';
import {
  ImportHoldings,
  givenUpSentence,
  processImport,
  sweepImportLeases,
} from '../../server/features/history/imports.service.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { startAppProcess, type AppProcess } from '../support/server-process.ts';
import { waitUntil } from '../support/poll.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';
import { buildZip } from '../support/zip-builder.ts';
import type { ImportProgress } from '../../shared/history/schemas.ts';

/**
 * Issue 13 #9: a bulk import must not stay "working" after its worker is killed. Workers beat a
 * heartbeat on what they hold; every job-running process sweeps expired leases, gives the files back
 * and queues their import again (no restart), and gives a file up after IMPORT_MAX_ATTEMPTS claims.
 */

const JWT_SECRET = 'import-leases-test-secret-0123456789abcdef';
const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-leases-'));
const config = testConfig({ dataDir, jwtSecret: JWT_SECRET });
const store = createFsStore(dataDir);
const app = createApp({ config, store, mailer: recordingMailer });
const processes: AppProcess[] = [];

afterAll(async () => {
  await Promise.all(processes.map((p) => p.stop()));
  await stopImportSender();
  rmSync(dataDir, { recursive: true, force: true });
}, 120_000);

const BASE_T = Date.UTC(2025, 3, 7, 6, 0);

/** A generated run of `minutes` at 3.2 m/s, a point every `sampleS` s, one day and one minute after the previous. */
function gpxFile(index: number, minutes: number, sampleS: number): { name: string; data: Buffer } {
  const start_t = BASE_T + index * 86_400_000 + index * 60_000;
  const run = generateLakeRun({
    start_t,
    phases: [{ kind: 'run', duration_s: minutes * 60, speed_mps: 3.2 }],
    sample_s: sampleS,
  });
  return {
    name: `block/run-${String(index).padStart(2, '0')}.gpx`,
    data: Buffer.from(writeGpx(`Lake loop ${index}`, [run.points])),
  };
}

async function signedIn() {
  const { user, password } = await createUser();
  const res = await request(app).post('/api/auth/token').send({ email: user.email, password });
  expect(res.status).toBe(200);
  return { user, auth: { Authorization: `Bearer ${res.body.token as string}` } };
}

async function upload(auth: Record<string, string>, zip: Buffer): Promise<string> {
  const res = await request(app).post('/api/imports').set(auth).attach('file', zip, 'block.zip');
  expect(res.status).toBe(202);
  return res.body.import.id as string;
}

/** The import's answer, as the shared contract declares it (no copy of the type here). */
type Progress = ImportProgress;

async function progressOf(auth: Record<string, string>, id: string): Promise<Progress> {
  const res = await request(app).get(`/api/imports/${id}`).set(auth);
  expect(res.status).toBe(200);
  return res.body as Progress;
}

/** Makes the heartbeats of an import and its files in hand look `seconds` old, as when their worker died that long ago. */
async function ageHeartbeats(importId: string, seconds: number) {
  await db.raw(
    "update import_files set heartbeat_at = now() - make_interval(secs => ?) where import_id = ? and status = 'working'",
    [seconds, importId],
  );
  await db.raw('update imports set heartbeat_at = now() - make_interval(secs => ?) where id = ?', [seconds, importId]);
}

const fileRow = (importId: string, position: number) =>
  db('import_files').where({ import_id: importId, position }).first('status', 'attempts', 'result');

describe('the import lease sweep', () => {
  it('gives back a file whose worker stopped beating, queues its import once, and gives the file up after 3 claims with a sentence', async () => {
    const { user, auth } = await signedIn();
    const importId = await upload(auth, buildZip([0, 1, 2].map((i) => gpxFile(i, 10, 5))));
    const queued: string[] = [];
    const sweep = () =>
      sweepImportLeases({ leaseSeconds: 60, maxAttempts: 3, dataDir, enqueue: async (id) => void queued.push(id) });

    // A worker takes the queued job and file 0, then dies: nothing beats them any more.
    await db.raw("update pgboss.job set state = 'active' where name = 'history-import' and data->>'importId' = ?", [importId]);
    const first = (await claimFile(importId, 0))!;
    expect(first.attempt).toBe(1);
    await ageHeartbeats(importId, 30);
    expect(await sweep()).toEqual({ requeued: [], givenUp: [] }); // 30 s of silence is within the 60 s lease
    expect(await fileRow(importId, 0)).toMatchObject({ status: 'working', attempts: 1 });

    await ageHeartbeats(importId, 61);
    expect(await sweep()).toEqual({ requeued: [importId], givenUp: [] });
    expect(await fileRow(importId, 0)).toMatchObject({ status: 'pending', attempts: 1 });
    // Queued once: the next sweep leaves the import to that job.
    expect(await sweep()).toEqual({ requeued: [], givenUp: [] });
    expect(queued).toEqual([importId]);
    // The dead worker's claim can no longer count the file.
    expect(await db.transaction((trx) => completeFile(first, 'block/run-00.gpx', { status: 'duplicate', result: {} }, trx))).toBe(
      undefined,
    );

    // Two more workers die on file 0; the sweep after the third claim gives it up.
    for (const attempt of [2, 3]) {
      expect((await claimFile(importId, 0))!.attempt).toBe(attempt);
      await ageHeartbeats(importId, 61);
      const swept = await sweep();
      if (attempt < 3) expect(swept.givenUp).toEqual([]);
      else expect(swept.givenUp).toEqual([{ importId, name: 'block/run-00.gpx' }]);
    }
    expect(await fileRow(importId, 0)).toMatchObject({ status: 'rejected', attempts: 3, result: { error: givenUpSentence(3) } });
    expect(givenUpSentence(3)).toBe(
      'The import stopped 3 times while reading this file, so it was skipped. Upload it on its own from the Log page to see what is wrong with it.',
    );
    expect(await progressOf(auth, importId)).toMatchObject({
      status: 'queued', // no live worker has taken it up yet
      done: 1,
      imported: 0,
      rejected: [{ file: 'block/run-00.gpx', error: givenUpSentence(3) }],
    });

    // A live worker imports the other two; the import ends with the given-up file among the rejected.
    await processImport(importId, {
      store,
      dataDir,
      maxEntryBytes: config.uploadMaxFileBytes,
      filesAtOnce: 2,
      holdings: new ImportHoldings(),
      shouldStop: () => false,
    });
    expect(await progressOf(auth, importId)).toMatchObject({
      status: 'done',
      total: 3,
      done: 3,
      imported: 2,
      duplicates: 0,
      rejected: [{ file: 'block/run-00.gpx', error: givenUpSentence(3) }],
    });
    expect(Number((await db('runs').where({ user_id: user.id }).count({ n: '*' }).first())!.n)).toBe(2);
    expect(await db('import_files').where({ import_id: importId, status: 'working' })).toEqual([]);
  });

  it('a worker killed with SIGKILL mid-import: the other worker’s sweep queues the file again and the import ends with every file imported once', async () => {
    const FILES = 40;
    const LEASE_SECONDS = 8;
    const env = { JWT_SECRET, DATA_DIR: dataDir, BCRYPT_COST: '4', IMPORT_LEASE_SECONDS: String(LEASE_SECONDS) };
    // One at a time: two cold starts at once only compete for the same two cores.
    for (let i = 0; i < 2; i++) processes.push(await startAppProcess('worker', env));
    const { user, auth } = await signedIn();
    // 40 minutes recorded every second: each file keeps a worker busy long enough to be caught mid-file.
    const importId = await upload(auth, buildZip(Array.from({ length: FILES }, (_, i) => gpxFile(i, 40, 1))));

    // Wait until a worker is in the middle of the import (files done, a file in hand, plenty left), then kill it.
    const pidOf = (label: string | null) => Number(label?.split(':').pop());
    const victim = await waitUntil(
      async () => {
        const progress = await progressOf(auth, importId);
        if (progress.done < 2 || progress.done > FILES - 10) return undefined;
        const working = await db('import_files').where({ import_id: importId, status: 'working' }).first('claimed_by');
        return processes.find((p) => p.pid === pidOf((working?.claimed_by as string | undefined) ?? null));
      },
      'a worker to be in the middle of the import',
      300_000,
    );
    const exited = new Promise<void>((resolve) => victim.child.once('exit', () => resolve()));
    victim.child.kill('SIGKILL');
    await exited;
    const killedAt = Date.now();
    const survivor = processes.find((p) => p !== victim)!;
    const inHand = await db('import_files')
      .where({ import_id: importId, status: 'working' })
      .select('position', 'claimed_by', 'attempts');
    // The killed worker's files stay "working" until the lease sweep gives them back.
    expect(inHand.length).toBeGreaterThan(0);
    expect(inHand.every((f) => pidOf(f.claimed_by as string) === victim.pid && f.attempts === 1)).toBe(true);

    const progress = await waitUntil(
      async () => {
        const p = await progressOf(auth, importId);
        return p.status === 'done' || p.status === 'failed' ? p : undefined;
      },
      'the import to finish after the kill',
      300_000,
    );
    const recoveredS = (Date.now() - killedAt) / 1000;
    expect(progress).toMatchObject({ status: 'done', total: FILES, done: FILES, imported: FILES, duplicates: 0, rejected: [] });

    // Every file imported exactly once: 40 runs, 40 originals, each file naming one run, no run twice, none left working.
    const runs = await db('runs').where({ user_id: user.id }).select('id');
    expect(runs).toHaveLength(FILES);
    expect(Number((await db('source_files').where({ user_id: user.id }).count({ n: '*' }).first())!.n)).toBe(FILES);
    const files = await db('import_files')
      .where({ import_id: importId })
      .select('position', 'status', 'result', 'claimed_by', 'attempts');
    expect(files.filter((f) => f.status !== 'imported')).toEqual([]);
    const runIds = files.flatMap((f) => (f.result as { runIds: string[] }).runIds);
    expect(runIds).toHaveLength(FILES);
    expect(new Set(runIds)).toEqual(new Set(runs.map((r) => r.id as string)));
    // The files the killed worker held were taken again by the survivor, on their second attempt.
    for (const held of inHand) {
      expect(files.find((f) => f.position === held.position)).toMatchObject({ attempts: 2 });
      expect(pidOf(files.find((f) => f.position === held.position)!.claimed_by as string)).toBe(survivor.pid);
    }
    // Without a restart: the survivor was running before the kill, and its periodic sweep queued the import again.
    expect(survivor.child.exitCode).toBe(null);
    const sweepLine = survivor.logs.find(
      (l) =>
        l.msg === 'import lease sweep: work of a stopped worker was queued again' &&
        (l.requeued as string[] | undefined)?.includes(importId),
    );
    expect(sweepLine).toBeDefined();
    console.log(
      `import leases: killed worker held ${inHand.length} file(s); import of ${FILES} files done ${recoveredS.toFixed(1)} s after the kill (lease ${LEASE_SECONDS} s)`,
    );
  }, 900_000);
});
