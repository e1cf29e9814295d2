import { spawn, type ChildProcess } from 'node:child_process';
import { createHash, randomUUID } from 'node:crypto';
import { mkdirSync, mkdtempSync, readdirSync, utimesSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Knex } from 'knex';
import { afterEach, describe, expect, it } from 'vitest';
import { holdOriginalFilesSharedLock } from '../../server/features/runs/original-files.repository.ts';
import { sweepOrphans } from '../../server/features/runs/orphan-sweeper.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { waitUntil } from '../support/poll.ts';

/**
 * The real server as a child process, killed with SIGKILL at the worst moments of an upload, then
 * started again: nothing half-stored may remain, and the orphan sweeper removes an original file a
 * crash between storing it and COMMIT left behind.
 */

const ROOT = process.cwd();
const JWT_SECRET = 'crash-recovery-test-secret-0123456789abcdef';
const HOUR_MS = 3600_000;

const children = new Set<ChildProcess>();
let heldLock: Knex.Transaction | null = null;

afterEach(async () => {
  // Even after a failed assertion: no server outlives its test, and no lock outlives the test that took it.
  await heldLock?.rollback().catch(() => undefined);
  heldLock = null;
  await Promise.all([...children].map((child) => killChild(child)));
  children.clear();
});

async function killChild(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  child.kill('SIGKILL');
  await exited;
}

interface ServerProcess {
  url: string;
  child: ChildProcess;
  /** The server's pino log lines so far. */
  logs: Array<{ msg?: string; [field: string]: unknown }>;
}

/** Starts `server/index.ts` as the real server would run, on a free port; resolves once /api/health answers 200. */
async function startServerProcess(dataDir: string): Promise<ServerProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: ROOT,
    env: {
      ...process.env, // DATABASE_URL: this layer's test database
      NODE_ENV: 'test',
      DATA_DIR: dataDir,
      PORT: '0',
      HOST: '127.0.0.1',
      JWT_SECRET,
      MAIL_CATCHER_PORT: '0',
      SMTP_URL: '',
      STORAGE: 'fs',
      LOG_LEVEL: 'info',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.add(child);
  const server: ServerProcess = { url: '', child, logs: [] };
  let pending = '';
  let stderr = '';
  child.stdout!.setEncoding('utf8').on('data', (chunk: string) => {
    const lines = (pending + chunk).split('\n');
    pending = lines.pop()!;
    for (const line of lines) {
      try {
        server.logs.push(JSON.parse(line) as ServerProcess['logs'][number]);
      } catch {
        // not a log line
      }
    }
  });
  child.stderr!.setEncoding('utf8').on('data', (chunk: string) => (stderr += chunk));
  const alive = () => {
    if (child.exitCode !== null) throw new Error(`the server exited with code ${child.exitCode}:\n${stderr}`);
  };
  const listening = await waitUntil(
    () => {
      alive();
      return server.logs.find((l) => l.msg?.startsWith('Pacewright is listening on '))?.msg;
      // A cold `tsx` start compiles the whole server: tens of seconds on a loaded 2-core machine.
    },
    'the server to listen',
    90_000,
  );
  server.url = listening.slice('Pacewright is listening on '.length);
  await waitUntil(async () => {
    alive();
    return (await fetch(`${server.url}/api/health`).catch(() => null))?.status === 200;
  }, 'the server to answer /api/health');
  return server;
}

async function bearerFor(url: string, email: string, password: string): Promise<string> {
  const res = await fetch(`${url}/api/auth/token`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  expect(res.status).toBe(200);
  return `Bearer ${((await res.json()) as { token: string }).token}`;
}

async function uploadTo(url: string, authorization: string, name: string, data: Buffer) {
  const form = new FormData();
  form.append('files', new Blob([new Uint8Array(data)]), name);
  return fetch(`${url}/api/runs`, { method: 'POST', headers: { Authorization: authorization }, body: form });
}

const tempDataDir = () => mkdtempSync(path.join(tmpdir(), 'pacewright-crash-'));
const sha256 = (data: Buffer) => createHash('sha256').update(data).digest('hex');
const count = async (table: string) => Number((await db(table).count({ n: '*' }).first())!.n);
const storedCounts = async () => ({
  source_files: await count('source_files'),
  runs: await count('runs'),
  run_tracks: await count('run_tracks'),
  run_splits: await count('run_splits'),
});

/** Keys of the originals on disk, as the store names them. */
function storedOriginals(dataDir: string): string[] {
  const root = path.join(dataDir, 'files');
  try {
    return readdirSync(root, { recursive: true, withFileTypes: true })
      .filter((e) => e.isFile())
      .map((e) => path.relative(root, path.join(e.parentPath, e.name)).split(path.sep).join('/'))
      .sort();
  } catch {
    return [];
  }
}

function lakeRunGpx(name: string, minutes: number, seed: number): Buffer {
  const run = generateLakeRun({
    start_t: Date.UTC(2026, 2, 1 + seed, 7),
    phases: [{ kind: 'run', duration_s: minutes * 60, speed_mps: 3.1 }],
    seed,
    sample_s: 1,
  });
  return Buffer.from(writeGpx(name, [run.points]));
}

/** Writes a file in DATA_DIR as a crash would have left it, last written `ageMs` ago. */
function plantFile(file: string, data: Buffer, ageMs: number): void {
  mkdirSync(path.dirname(file), { recursive: true });
  writeFileSync(file, data);
  const when = new Date(Date.now() - ageMs);
  utimesSync(file, when, when);
}

/**
 * Starts an upload that will never finish: the multipart head and the first half of `data`, sent
 * with a token not used before. Resolves once the server has taken the request (authenticating it
 * marks the token used) and is waiting for the rest of the body.
 */
async function startHalfSentUpload(server: ServerProcess, authorization: string, userId: string, data: Buffer) {
  const boundary = `----crash-test-${randomUUID()}`;
  const head = Buffer.from(
    `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="long-run.gpx"\r\nContent-Type: application/gpx+xml\r\n\r\n`,
  );
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  const req = http.request(`${server.url}/api/runs`, {
    method: 'POST',
    headers: {
      Authorization: authorization,
      'Content-Type': `multipart/form-data; boundary=${boundary}`,
      'Content-Length': head.length + data.length + tail.length,
    },
  });
  const outcome = new Promise<string>((resolve) => {
    req.on('response', (res) => resolve(`answered ${res.statusCode}`));
    req.on('error', () => resolve('connection lost'));
  });
  req.write(head);
  req.write(data.subarray(0, data.length / 2));
  await waitUntil(async () => {
    const unused = await db('api_tokens').where({ user_id: userId }).whereNull('last_used_at').count({ n: '*' }).first();
    return Number(unused!.n) === 0;
  }, 'the server to take the half-sent upload');
  req.write(data.subarray(data.length / 2, (data.length * 3) / 4));
  return { outcome };
}

/**
 * Starts an upload whose import transaction, its source_files row already written, waits on its
 * runs insert because the test holds `LOCK TABLE runs`. Resolves once PostgreSQL shows it waiting.
 */
async function startBlockedImport(server: ServerProcess, authorization: string, data: Buffer) {
  heldLock = await db.transaction();
  // EXCLUSIVE, not ACCESS EXCLUSIVE: the import's same-run lookup (a plain SELECT) must pass; its INSERT must wait.
  await heldLock.raw('lock table runs in exclusive mode');
  const outcome = uploadTo(server.url, authorization, 'morning.gpx', data).then(
    (res) => `answered ${res.status}`,
    () => 'connection lost',
  );
  const { pid } = await waitUntil(async () => {
    const { rows } = await db.raw<{ rows: Array<{ pid: number }> }>(
      `select pid from pg_stat_activity
        where datname = current_database() and wait_event_type = 'Lock' and query ilike 'insert into "runs"%'`,
    );
    return rows[0];
  }, "the server's insert to wait for the lock");
  return { outcome, pid };
}

/** Lets go of the lock; the killed server's session then ends without committing (its client is gone). */
async function releaseLockAfterKill(pid: number) {
  await heldLock!.rollback();
  heldLock = null;
  await waitUntil(async () => {
    const { rows } = await db.raw<{ rows: unknown[] }>('select 1 from pg_stat_activity where pid = ?', [pid]);
    return rows.length === 0;
  }, 'the killed server’s database session to end');
}

describe('the web server killed (SIGKILL) during uploads', () => {
  // One kill catches two uploads at their worst moments, so the journey needs only two server starts
  // (each takes seconds on a busy machine).
  it('killed mid-body and mid-transaction: after a restart nothing is half-stored, a crash’s orphan is swept, every file in use is kept', async () => {
    const dataDir = tempDataDir();
    const importsDir = path.join(dataDir, 'imports');
    const { user, password } = await createUser();
    const keyOf = (data: Buffer) => `${user.id}/${sha256(data)}`;
    const longRun = lakeRunGpx('Long lake run', 75, 1); // about 4,500 points: many TCP packets
    const morningRun = lakeRunGpx('Morning lake run', 30, 2);
    const keptRun = lakeRunGpx('Kept lake run', 20, 3);
    const orphanRun = lakeRunGpx('Lost lake run', 20, 4);
    const freshRun = lakeRunGpx('Arriving lake run', 20, 5);
    expect(longRun.length).toBeGreaterThan(500_000);

    const first = await startServerProcess(dataDir);
    const authorization = await bearerFor(first.url, user.email, password);
    const kept = await uploadTo(first.url, authorization, 'kept.gpx', keptRun);
    expect(kept.status).toBe(201);
    const keptRunId = ((await kept.json()) as { imported: Array<{ id: string }> }).imported[0]!.id;

    // Both tokens first: creating a token locks the user's row (the per-user token cap), which the
    // blocked import's transaction also holds until the kill.
    const secondAuthorization = await bearerFor(first.url, user.email, password);
    const blocked = await startBlockedImport(first, authorization, morningRun);
    const halfSent = await startHalfSentUpload(first, secondAuthorization, user.id, longRun);
    await killChild(first.child);
    await releaseLockAfterKill(blocked.pid);
    expect(await blocked.outcome).toBe('connection lost');
    expect(await halfSent.outcome).toBe('connection lost');
    expect(await storedCounts()).toMatchObject({ source_files: 1, runs: 1, run_tracks: 1 });
    expect(storedOriginals(dataDir)).toEqual([keyOf(keptRun)]);

    // What a crash between store.put and COMMIT leaves (a file at a valid key that no row names), an
    // hour old; the same just written (another process may be about to commit); the kept run's file
    // made old, so age alone cannot get it removed; a file the app never writes; and bulk-import
    // leftovers: an archive with no import row and a half-received upload, both old, and an upload arriving now.
    plantFile(path.join(dataDir, 'files', keyOf(keptRun)), keptRun, 2 * HOUR_MS);
    plantFile(path.join(dataDir, 'files', keyOf(orphanRun)), orphanRun, HOUR_MS);
    plantFile(path.join(dataDir, 'files', keyOf(freshRun)), freshRun, 0);
    plantFile(path.join(dataDir, 'files', 'notes.txt'), Buffer.from('not the app’s'), HOUR_MS);
    const leftoverArchive = `${randomUUID()}.zip`;
    const deadUpload = `upload-${randomUUID()}.part`;
    const liveUpload = `upload-${randomUUID()}.part`;
    plantFile(path.join(importsDir, leftoverArchive), Buffer.from('PK'), HOUR_MS);
    plantFile(path.join(importsDir, deadUpload), Buffer.from('PK'), HOUR_MS);
    plantFile(path.join(importsDir, liveUpload), Buffer.from('PK'), 0);

    // Restarted: still nothing half-stored, and the sweep at start removes exactly the old leftovers.
    const second = await startServerProcess(dataDir);
    const finished = await waitUntil(() => second.logs.find((l) => l.msg === 'orphan sweep finished'), 'the first orphan sweep');
    expect(finished).toMatchObject({ removedOriginals: 1, removedArchives: 2, graceSeconds: 600 });
    expect(second.logs.filter((l) => l.msg?.startsWith('removed an original file')).map((l) => l.key)).toEqual([
      keyOf(orphanRun),
    ]);
    expect(storedOriginals(dataDir)).toEqual([keyOf(freshRun), keyOf(keptRun), 'notes.txt'].sort());
    expect(readdirSync(importsDir)).toEqual([liveUpload]);
    expect(await storedCounts()).toMatchObject({ source_files: 1, runs: 1, run_tracks: 1 });
    const original = await fetch(`${second.url}/api/runs/${keptRunId}/original`, { headers: { Authorization: authorization } });
    expect(original.status).toBe(200);
    expect(Buffer.compare(Buffer.from(await original.arrayBuffer()), keptRun)).toBe(0);

    // The killed process's two uploads held places among the uploads a runner may have arriving at
    // once; they are leased (server/lib/README.md, "Shared limits") and free when the lease runs out.
    await waitUntil(
      async () =>
        Number(
          (
            await db('upload_slots')
              .where({ user_id: user.id })
              .andWhere('expires_at', '>', db.fn.now())
              .count<{ count: string }[]>('* as count')
          )[0]!.count,
        ) === 0,
      'the killed process’s upload places to be freed',
      60_000,
    );
    // Neither interrupted upload left a trace the duplicate check could trip over.
    for (const [name, data] of [
      ['long-run.gpx', longRun],
      ['morning.gpx', morningRun],
    ] as const) {
      const res = await uploadTo(second.url, authorization, name, data);
      expect(res.status).toBe(201);
      expect(((await res.json()) as { duplicates: unknown[] }).duplicates).toEqual([]);
    }
    expect(await storedCounts()).toMatchObject({ source_files: 3, runs: 3, run_tracks: 3 });
  }, 240_000);
});

describe('the orphan sweep and an upload on another process', () => {
  /** What an upload does between storing its original and COMMIT: rows written, shared lock held, file stored. */
  async function uploadUpToCommit(dataDir: string, userId: string, data: Buffer) {
    const key = `${userId}/${sha256(data)}`;
    const trx = await db.transaction();
    heldLock = trx;
    await trx('source_files').insert({
      user_id: userId,
      original_name: 'arriving.gpx',
      sha256: sha256(data),
      size_bytes: String(data.length),
      storage_key: key,
      format: 'gpx',
    });
    await holdOriginalFilesSharedLock(trx);
    await createFsStore(dataDir).put(key, data);
    // Made old, so only the lock, not the grace period, can be what keeps it.
    const anHourAgo = new Date(Date.now() - HOUR_MS);
    utimesSync(path.join(dataDir, 'files', key), anHourAgo, anHourAgo);
    return { key, trx };
  }

  async function waitForSweepToQueue() {
    await waitUntil(async () => {
      const { rows } = await db.raw<{ rows: unknown[] }>(
        "select 1 from pg_stat_activity where datname = current_database() and wait_event = 'advisory'",
      );
      return rows.length > 0;
    }, 'the sweep to wait for the upload');
  }

  it('a sweep waits for an upload between storing and COMMIT, then keeps its file however old', async () => {
    const dataDir = tempDataDir();
    const { user } = await createUser();
    const data = lakeRunGpx('Arriving lake run', 10, 6);
    const { key, trx } = await uploadUpToCommit(dataDir, user.id, data);
    const sweep = sweepOrphans({ store: createFsStore(dataDir), dataDir, graceSeconds: 600 });
    await waitForSweepToQueue();
    await trx.commit();
    heldLock = null;
    expect((await sweep).originals).toEqual([]);
    expect(storedOriginals(dataDir)).toEqual([key]);
  }, 20_000);

  it('when that upload rolls back instead, the sweep removes the file it left', async () => {
    const dataDir = tempDataDir();
    const { user } = await createUser();
    const data = lakeRunGpx('Abandoned lake run', 10, 7);
    const { key, trx } = await uploadUpToCommit(dataDir, user.id, data);
    const sweep = sweepOrphans({ store: createFsStore(dataDir), dataDir, graceSeconds: 600 });
    await waitForSweepToQueue();
    await trx.rollback();
    heldLock = null;
    expect((await sweep).originals).toEqual([key]);
    expect(storedOriginals(dataDir)).toEqual([]);
  }, 20_000);
});
