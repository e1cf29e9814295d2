/**
 * Issue 13, the upload limits one by one (findings 2 and 8), each with the figure it holds: the cap on uploads
 * arriving at once per user, the storage quota, the track's share of its file, the points per track and the
 * hours per run. Every refusal is a sentence a runner understands, and nothing of a refused upload is left:
 * no run row, no stored original, no temporary file.
 */
import { existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { loadConfig } from '../../server/config.ts';
import { db } from '../../server/lib/db.ts';
import { uploadSlotsHeldBy } from '../../server/lib/shared-limits.repository.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { CONTROL_CHARACTER_MESSAGE } from '../../shared/api/text.ts';
import {
  MAX_TRACK_HOURS,
  MAX_TRACK_POINTS,
  MIN_TRACK_SHARE,
  TRACK_SHARE_MIN_FILE_BYTES,
  trackShareOf,
} from '../../shared/runs/upload-limits.ts';
import { streamMultipart, uploadLeftOpen, writeLongGpx, type LongTrackOptions } from '../support/big-uploads.ts';
import { createUser } from '../support/factories.ts';
import { waitUntil } from '../support/poll.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

type App = ReturnType<typeof createApp>;

const work = mkdtempSync(path.join(tmpdir(), 'pacewright-limits-'));
let fileNumber = 0;

/** A GPX file of `points` points written for this test; returns its path and size. */
async function gpx(options: Partial<LongTrackOptions> & { points: number }) {
  const file = path.join(work, `track-${++fileNumber}.gpx${options.gzip ? '.gz' : ''}`);
  const size = await writeLongGpx(file, {
    stepS: 1,
    startMs: Date.UTC(2026, 9, 1, 6) + fileNumber * 86_400_000,
    seed: fileNumber,
    ...options,
  });
  return { file, size, name: path.basename(file) };
}

function appWith(overrides: Parameters<typeof testConfig>[0] = {}) {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-data-'));
  const config = testConfig({ dataDir, ...overrides });
  return { app: createApp({ config, store: createFsStore(dataDir), mailer: recordingMailer }), dataDir, config };
}

async function runnerOf(app: App) {
  const { user, password } = await createUser();
  const res = await request(app).post('/api/auth/token').send({ email: user.email, password });
  expect(res.body.token, JSON.stringify(res.body)).toEqual(expect.any(String));
  return { user, auth: { Authorization: `Bearer ${res.body.token as string}` } };
}

const filesIn = (dir: string) => (existsSync(dir) ? readdirSync(dir) : []);

/** What a user keeps: run rows, original-file rows, originals on disk; and the temporary files of uploads. */
async function leftBy(userId: string, dataDir: string) {
  const count = async (table: string) => Number((await db(table).where({ user_id: userId }).count({ n: '*' }).first())!.n);
  return {
    runs: await count('runs'),
    sourceFiles: await count('source_files'),
    originals: filesIn(path.join(dataDir, 'files', userId)).length,
    temporary: filesIn(path.join(dataDir, 'uploads')).length,
  };
}

const upload = (app: App, auth: Record<string, string>, file: { file: string; name: string }) =>
  request(app).post('/api/runs').set(auth).attach('files', file.file, file.name);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('uploads arriving at once, per user', () => {
  // The real number (testConfig lifts it so other tests can upload in parallel).
  const AT_ONCE = loadConfig({ NODE_ENV: 'test' }).uploadsAtOncePerUser;
  let server: http.Server;
  let baseUrl: string;
  let dataDir: string;
  let app: App;

  beforeAll(async () => {
    ({ app, dataDir } = appWith({ uploadsAtOncePerUser: AT_ONCE }));
    server = http.createServer(app);
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  });

  afterAll(async () => {
    server.closeAllConnections();
    await new Promise((resolve) => server.close(resolve));
  });

  it(`a third upload while ${AT_ONCE} are arriving gets 429 with a sentence; once they end, uploads are let in again`, async () => {
    expect(AT_ONCE).toBe(2);
    const { user, auth } = await runnerOf(app);
    const open = [uploadLeftOpen(`${baseUrl}/api/runs`, auth), uploadLeftOpen(`${baseUrl}/api/runs`, auth)];
    // Both bodies are being written to disk: the server has let both in.
    await waitUntil(() => filesIn(path.join(dataDir, 'uploads')).length === AT_ONCE, 'two uploads arriving', 20_000, 25);

    const small = await gpx({ points: 600 });
    const third = await streamMultipart(`${baseUrl}/api/runs`, auth, [
      { field: 'files', filename: small.name, path: small.file },
    ]);
    console.log(`uploads at once per user: ${AT_ONCE} let in, the next answered ${third.status}`);
    expect(third.status).toBe(429);
    expect(third.body).toMatchObject({
      code: 'uploads-in-progress',
      error: 'You already have 2 uploads arriving. Wait until they are finished, then send the next files.',
    });
    expect((await leftBy(user.id, dataDir)).runs).toBe(0);

    for (const req of open) req.destroy();
    // The two broken-off uploads leave nothing behind.
    await waitUntil(() => filesIn(path.join(dataDir, 'uploads')).length === 0, 'the broken-off uploads removed', 20_000, 25);
    expect(await leftBy(user.id, dataDir)).toEqual({ runs: 0, sourceFiles: 0, originals: 0, temporary: 0 });
    // Their places (rows in PostgreSQL, shared by every web process) are given back as the connections close.
    await waitUntil(async () => (await uploadSlotsHeldBy(user.id)) === 0, 'the broken-off uploads’ slots given back');

    // Their places are free again.
    const after = await streamMultipart(`${baseUrl}/api/runs`, auth, [
      { field: 'files', filename: small.name, path: small.file },
    ]);
    expect(after.status, after.text).toBe(201);
    expect(await leftBy(user.id, dataDir)).toEqual({ runs: 1, sourceFiles: 1, originals: 1, temporary: 0 });
  }, 120_000);
});

describe('storage quota per user (STORAGE_QUOTA_MB)', () => {
  // As an operator sets it: STORAGE_QUOTA_MB=1.
  const QUOTA = loadConfig({ NODE_ENV: 'test', STORAGE_QUOTA_MB: '1' }).storageQuotaBytes;

  it('an upload past the quota is refused with a sentence and nothing of it is stored; GET /api/me/storage shows the figures', async () => {
    expect(QUOTA).toBe(1024 * 1024);
    const { app, dataDir } = appWith({ storageQuotaBytes: QUOTA });
    const { user, auth } = await runnerOf(app);
    // Two files of about 600 KB: the first fits in 1 MB, the second does not.
    const first = await gpx({ points: 6000 });
    const second = await gpx({ points: 6000 });
    expect(first.size).toBeLessThan(QUOTA);
    expect(first.size + second.size).toBeGreaterThan(QUOTA);

    expect((await upload(app, auth, first)).status).toBe(201);
    const storage = await request(app).get('/api/me/storage').set(auth);
    expect(storage.status).toBe(200);
    expect(storage.body).toEqual({ used_bytes: first.size, quota_bytes: QUOTA, files: 1 });

    const refused = await upload(app, auth, second);
    console.log(
      `storage quota ${QUOTA} B: ${first.size} B kept, a further ${second.size} B answered ${refused.status} (${refused.body.code})`,
    );
    expect(refused.status).toBe(413);
    expect(refused.body.code).toBe('storage-full');
    expect(refused.body.error).toMatch(
      /^This upload does not fit in your storage: \d+(\.\d)? KB of your 1 MB is already used by original files\. Delete runs you no longer need to make room; nothing from this upload was stored\.$/,
    );
    expect(await leftBy(user.id, dataDir)).toEqual({ runs: 1, sourceFiles: 1, originals: 1, temporary: 0 });
    expect((await request(app).get('/api/me/storage').set(auth)).body.used_bytes).toBe(first.size);
  }, 60_000);

  it('two uploads at once that each fit but not together: exactly one is stored, the other refused in words', async () => {
    const { app, dataDir } = appWith({ storageQuotaBytes: QUOTA });
    const { user, auth } = await runnerOf(app);
    const [a, b] = [await gpx({ points: 6000 }), await gpx({ points: 6000 })];
    const answers = await Promise.all([upload(app, auth, a), upload(app, auth, b)]);
    const statuses = answers.map((r) => r.status).sort();
    // Either the second was stopped while arriving (413), or both arrived and the storage lock let one in (422).
    expect(statuses[0]).toBe(201);
    expect([413, 422]).toContain(statuses[1]);
    const loser = answers.find((r) => r.status !== 201)!;
    const sentence = loser.status === 413 ? loser.body.error : loser.body.rejected[0].error;
    expect(sentence).toMatch(/does not fit in your storage: .* of your 1 MB is (already )?used by original files/);
    expect(await leftBy(user.id, dataDir)).toEqual({ runs: 1, sourceFiles: 1, originals: 1, temporary: 0 });
  }, 60_000);

  it('when the quota is below what the runner keeps, the next upload is refused as “storage is full”', async () => {
    const { app, dataDir } = appWith({ storageQuotaBytes: QUOTA });
    const { user, auth } = await runnerOf(app);
    const kept = await gpx({ points: 6000 });
    expect((await upload(app, auth, kept)).status).toBe(201);
    // The operator lowers the quota to 500 KB (same database and files).
    const lowered = createApp({
      config: testConfig({ dataDir, storageQuotaBytes: 500 * 1024 }),
      store: createFsStore(dataDir),
      mailer: recordingMailer,
    });
    const next = await upload(lowered, auth, await gpx({ points: 600 }));
    expect(next.status).toBe(413);
    expect(next.body.error).toMatch(
      /^Your storage is full: \d+(\.\d)? KB of your 500 KB is used by original files\. Delete runs you no longer need to make room; nothing from this upload was stored\.$/,
    );
    expect(next.body.details).toEqual({ used_bytes: kept.size, quota_bytes: 500 * 1024 });
    expect(await leftBy(user.id, dataDir)).toEqual({ runs: 1, sourceFiles: 1, originals: 1, temporary: 0 });
  }, 60_000);
});

describe('what one track may be', () => {
  let app: App;
  let dataDir: string;
  beforeAll(() => {
    ({ app, dataDir } = appWith());
  });

  it(`a file of over ${TRACK_SHARE_MIN_FILE_BYTES / 1024 / 1024} MB whose track is under ${MIN_TRACK_SHARE * 100} % of it is refused; at 13 % it is a run`, async () => {
    const { user, auth } = await runnerOf(app);
    // 100 points (5 s apart) behind 1.5 MB of comment; the same with 200 points passes.
    const padded = await gpx({ points: 100, stepS: 5, paddingBytes: 1.5 * 1024 * 1024 });
    const enough = await gpx({ points: 200, stepS: 5, paddingBytes: 1.5 * 1024 * 1024 });
    const tinyShare = trackShareOf(padded.size, 100);
    console.log(
      `track share: ${(tinyShare * 100).toFixed(1)} % of ${padded.size} B refused, ${(trackShareOf(enough.size, 200) * 100).toFixed(1)} % of ${enough.size} B kept`,
    );
    expect(tinyShare).toBeLessThan(MIN_TRACK_SHARE);
    expect(trackShareOf(enough.size, 200)).toBeGreaterThan(MIN_TRACK_SHARE);

    const refused = await upload(app, auth, padded);
    expect(refused.status).toBe(422);
    expect(refused.body.rejected).toEqual([
      {
        file: padded.name,
        error: `This file is 1.5 MB but its track of 100 points fills less than 10 % of it; the rest is not GPS data. Export the run again from your watch or app, without notes or attachments, and upload that.`,
      },
    ]);
    expect(await leftBy(user.id, dataDir)).toEqual({ runs: 0, sourceFiles: 0, originals: 0, temporary: 0 });

    expect((await upload(app, auth, enough)).status).toBe(201);
  }, 60_000);

  it(`a file of ${MAX_TRACK_POINTS + 1} points (one over the limit) is refused with a sentence and nothing is stored`, async () => {
    const { user, auth } = await runnerOf(app);
    // Half a second apart: 27.8 hours, under the hours limit, so only the points decide.
    const many = await gpx({ points: MAX_TRACK_POINTS + 1, stepS: 0.5, gzip: true });
    const refused = await upload(app, auth, many);
    console.log(`points: ${MAX_TRACK_POINTS + 1} answered ${refused.status}`);
    expect(refused.status).toBe(422);
    expect(refused.body.rejected).toEqual([
      {
        file: many.name,
        error:
          'This file holds more than 200 000 track points, more than one run ever needs (about 55 hours at one point a second). Split it into single runs, or export it with fewer points, and upload those.',
      },
    ]);
    expect(await leftBy(user.id, dataDir)).toEqual({ runs: 0, sourceFiles: 0, originals: 0, temporary: 0 });
  }, 120_000);

  it(`a run of ${MAX_TRACK_HOURS} h is kept; one of ${MAX_TRACK_HOURS} h 1 min is refused with a sentence and nothing is stored`, async () => {
    const { user, auth } = await runnerOf(app);
    // A point a minute: 2 881 points span exactly 48 h, 2 882 points 48 h 1 min.
    const fortyEight = await gpx({ points: MAX_TRACK_HOURS * 60 + 1, stepS: 60 });
    const longer = await gpx({ points: MAX_TRACK_HOURS * 60 + 2, stepS: 60 });

    const refused = await upload(app, auth, longer);
    console.log(`hours: 48 h 1 min answered ${refused.status}`);
    expect(refused.status).toBe(422);
    expect(refused.body.rejected).toEqual([
      {
        file: longer.name,
        error:
          'This track lasts 48 hours 1 min from its first to its last point; one run can last at most 48 hours. If the watch kept recording between runs, split the file into single runs and upload those.',
      },
    ]);
    expect(await leftBy(user.id, dataDir)).toEqual({ runs: 0, sourceFiles: 0, originals: 0, temporary: 0 });

    const kept = await upload(app, auth, fortyEight);
    expect(kept.status, JSON.stringify(kept.body)).toBe(201);
    expect(kept.body.imported[0].elapsed_s).toBe(MAX_TRACK_HOURS * 3600);
  }, 60_000);
});

describe('text that comes with a multipart upload', () => {
  it('a control character in a text field or a file name is refused with the sentence, and nothing is kept', async () => {
    const { app, dataDir } = appWith();
    const { user, auth } = await runnerOf(app);
    const file = await gpx({ points: 600 });

    const inField = await request(app)
      .post('/api/runs')
      .set(auth)
      .field('note', 'morning\u0000run')
      .attach('files', file.file, file.name);
    expect(inField.status).toBe(400);
    expect(inField.body).toMatchObject({
      code: 'validation-failed',
      error: CONTROL_CHARACTER_MESSAGE,
      details: [{ field: 'note', message: CONTROL_CHARACTER_MESSAGE }],
    });

    // A C0 control in a part header is refused by the multipart reader itself; a C1 control (sent as UTF-8) reaches us.
    const inName = await request(app).post('/api/runs').set(auth).attach('files', file.file, 'morning\u0085run.gpx');
    expect(inName.status).toBe(400);
    expect(inName.body.details).toEqual([{ field: 'files.name', message: CONTROL_CHARACTER_MESSAGE }]);

    const archive = await request(app)
      .post('/api/imports')
      .set(auth)
      .attach('file', Buffer.from('PK\u0005\u0006' + '\u0000'.repeat(18), 'latin1'), 'history\u009b.zip');
    expect(archive.status).toBe(400);
    expect(archive.body.details).toEqual([{ field: 'file.name', message: CONTROL_CHARACTER_MESSAGE }]);

    expect(await leftBy(user.id, dataDir)).toEqual({ runs: 0, sourceFiles: 0, originals: 0, temporary: 0 });
    expect(Number((await db('imports').where({ user_id: user.id }).count({ n: '*' }).first())!.n)).toBe(0);
    expect(filesIn(path.join(dataDir, 'imports'))).toEqual([]);

    // Tabs and ordinary names still pass.
    const fine = await request(app).post('/api/runs').set(auth).field('note', 'a\tb').attach('files', file.file, file.name);
    expect(fine.status).toBe(201);
  }, 60_000);
});
