import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import request from 'supertest';
import { describe, expect, it, onTestFinished } from 'vitest';
import { createApp } from '../../server/app.ts';
import { DEFAULT_COMPUTE_LIMITS, configureComputePool } from '../../server/features/compute/compute-pool.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { createPrng, generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

function freshApp() {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-faults-'));
  return { app: createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer }), dataDir };
}

async function bearer(app: ReturnType<typeof freshApp>['app']) {
  const { user, password } = await createUser();
  const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
  return { user, password, auth: { Authorization: `Bearer ${token}` } };
}

const count = async (table: string) => Number((await db(table).count({ n: '*' }).first())!.n);
const storedFiles = (dataDir: string) => {
  try {
    return readdirSync(path.join(dataDir, 'files'), { recursive: true, withFileTypes: true }).filter((e) => e.isFile()).length;
  } catch {
    return 0;
  }
};

describe('concurrent uploads', () => {
  it('the same file uploaded 10 times at once gives exactly one run, and one stored original', async () => {
    const { app, dataDir } = freshApp();
    const { auth } = await bearer(app);
    const file = readFileSync('fixtures/gps-samples/run-hr-4s.gpx');
    const results = await Promise.all(
      Array.from({ length: 10 }, (_, i) => request(app).post('/api/runs').set(auth).attach('files', file, `copy-${i}.gpx`)),
    );
    expect(results.map((r) => r.status).sort()).toEqual([201, ...Array(9).fill(422)]);
    expect(results.flatMap((r) => r.body.duplicates as unknown[])).toHaveLength(9);
    expect(await count('runs')).toBe(1);
    expect(storedFiles(dataDir)).toBe(1);
  });

  it('50 different files at once give 50 runs, each with its own stored original', async () => {
    // The test configuration lifts the uploads one account may send at once (2 in production) so 50 arrive
    // together; the compute pool's bound on one account's waiting jobs (8, sized for those 2) is lifted alike,
    // else 40 of them get its 429 (compute-queue-per-account.api.test.ts proves that bound).
    configureComputePool({ waitingPerUser: 50 });
    onTestFinished(() => configureComputePool({ waitingPerUser: DEFAULT_COMPUTE_LIMITS.waitingPerUser }));
    const { app, dataDir } = freshApp();
    const { auth } = await bearer(app);
    const files = Array.from({ length: 50 }, (_, i) => {
      const run = generateLakeRun({
        start_t: Date.UTC(2026, 0, 1 + i, 7),
        phases: [{ kind: 'run', duration_s: 600, speed_mps: 3 }],
        seed: i,
        sample_s: 5,
      });
      return Buffer.from(writeGpx(`Run ${i}`, [run.points]));
    });
    const results = await Promise.all(
      files.map((f, i) => request(app).post('/api/runs').set(auth).attach('files', f, `run-${i}.gpx`)),
    );
    expect(results.map((r) => r.status)).toEqual(Array(50).fill(201));
    expect(await count('runs')).toBe(50);
    expect(await count('source_files')).toBe(50);
    expect(storedFiles(dataDir)).toBe(50);
    await expectEveryRunWhole(dataDir);
  }, 120_000);
});

/**
 * Every stored run is whole: its track is there, its km and mile splits add up to its distance
 * (a remainder under 1 m is never a split), and its source file is stored byte for byte.
 */
async function expectEveryRunWhole(dataDir: string) {
  const runs = await db('runs as r')
    .leftJoin('run_tracks as t', 't.run_id', 'r.id')
    .join('source_files as f', 'f.id', 'r.source_file_id')
    .select('r.id', 'r.distance_m', 't.point_count', 'f.storage_key', 'f.sha256');
  expect(runs.length).toBeGreaterThan(0);
  for (const run of runs) {
    expect(run.point_count, `run ${run.id} has no track`).toBeGreaterThan(0);
    for (const unit of ['km', 'mi'] as const) {
      const splits = await db('run_splits').where({ run_id: run.id, unit }).sum({ m: 'distance_m' }).first();
      expect(Math.abs(Number(splits?.m ?? 0) - run.distance_m), `${unit} splits of run ${run.id}`).toBeLessThan(1);
    }
    const original = readFileSync(path.join(dataDir, 'files', run.storage_key));
    expect(createHash('sha256').update(original).digest('hex')).toBe(run.sha256);
  }
  // No source file without its runs (a half-stored import would leave one).
  const lonely = await db('source_files as f')
    .whereNotExists(db('runs').whereRaw('runs.source_file_id = f.id'))
    .count({ n: '*' });
  expect(Number(lonely[0]!.n)).toBe(0);
}

describe('fuzzed uploads', () => {
  // Real device files (fixtures/gps-samples/SOURCES.tsv), GPX and TCX, small to mid-sized.
  const SAMPLES = [
    'run-hr-4s.gpx',
    'watch-run-3-laps.tcx',
    'ride-1s-4-segments.gpx',
    'run-excerpt-3-segments.gpx',
    'handheld-1s-partial-hr.gpx',
    'odd-backwards-time.tcx',
    'treadmill-no-position.tcx',
    'watch-run-no-elevation.gpx',
  ].map((f) => readFileSync(`fixtures/gps-samples/${f}`, 'utf8'));
  const TAGS = ['trkpt', 'trkseg', 'trk', 'time', 'ele', 'Trackpoint', 'Lap', 'Activity', 'Position', 'Time', 'gpx'];
  const HUGE = ['1e308', '-1e308', '99999999999999999999', 'NaN', 'Infinity', '-0', '1e-400', '0x10'];

  // Random damage (seeded, so a failure repeats): truncation, byte flips, tag swaps, huge numbers.
  function mutate(text: string, random: () => number): string {
    const at = Math.floor(random() * text.length);
    const pick = <T>(list: readonly T[]) => list[Math.floor(random() * list.length)]!;
    switch (Math.floor(random() * 7)) {
      case 0:
        return text.slice(0, at);
      case 1: {
        let out = text;
        for (let k = 0, n = 1 + Math.floor(random() * 8); k < n; k++) {
          const i = Math.floor(random() * out.length);
          out = out.slice(0, i) + String.fromCharCode(Math.floor(random() * 256)) + out.slice(i + 1);
        }
        return out;
      }
      case 2: {
        // Swap one tag name for another, opening or closing, somewhere after `at`.
        const [from, to] = [pick(TAGS), pick(TAGS)];
        const i = text.indexOf(random() < 0.5 ? `<${from}` : `</${from}`, at);
        return i < 0 ? text.replace(from, to) : text.slice(0, i) + text.slice(i).replace(from, to);
      }
      case 3: {
        // A huge or odd number in place of a coordinate, elevation, heart rate, time or distance.
        const fields = [/lat="[^"]*"/, /lon="[^"]*"/, /<ele>[^<]*</, /<hr>[^<]*</, /<Value>[^<]*</, /<DistanceMeters>[^<]*</];
        const field = pick(fields);
        const value = pick(HUGE);
        const i = text.slice(at).search(field);
        const replace = (m: string) => m.replace(/"[^"]*"|>[^<]*</, (q) => (q[0] === '"' ? `"${value}"` : `>${value}<`));
        return i < 0 ? text.replace(field, replace) : text.slice(0, at) + text.slice(at).replace(field, replace);
      }
      case 4:
        return text.replace(
          /<time>[^<]*</,
          `<time>${pick(['+275760-09-13T00:00:01Z', '0000-00-00T99:99:99Z', '2026-13-45T25:61:61Z', ''])}<`,
        );
      case 5:
        // A block of the file repeated (duplicate points, or an element opened twice).
        return text.slice(0, at) + text.slice(at, at + 300) + text.slice(at);
      default:
        return (
          text.slice(0, at) +
          text
            .slice(at, at + 200)
            .split('')
            .reverse()
            .join('') +
          text.slice(at + 200)
        );
    }
  }

  it('1 000 mutated files: never a 500, never a half-stored run, and the server answers afterwards', async () => {
    const { app, dataDir } = freshApp();
    const { auth } = await bearer(app);
    const random = createPrng(2026);
    const uploads = Array.from({ length: 1000 }, (_, i) => {
      const damaged = Buffer.from(mutate(mutate(SAMPLES[i % SAMPLES.length]!, random), random));
      // Every tenth file is sent gzip-compressed, as some devices export them, and sometimes damaged after compressing.
      if (i % 10 !== 9) return damaged;
      const packed = gzipSync(damaged);
      if (random() < 0.5) {
        const i = Math.floor(random() * packed.length);
        packed[i] = packed[i]! ^ 0xff;
      }
      return packed;
    });
    const statuses = new Map<number, number>();
    let imported = 0;
    // Four at a time, like a few runners uploading at once, in a fixed order.
    for (let i = 0; i < uploads.length; i += 4) {
      const batch = await Promise.all(
        uploads.slice(i, i + 4).map((data, k) =>
          request(app)
            .post('/api/runs')
            .set(auth)
            .attach('files', data, `fuzz-${i + k}.gpx`),
        ),
      );
      for (const res of batch) {
        statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
        if (res.status === 422 && res.body.rejected.length) expect(res.body.rejected[0].error).toMatch(/\.$/);
        imported += res.body.imported?.length ?? 0;
      }
    }
    expect(
      [...statuses.keys()].every((status) => status === 201 || status === 422),
      JSON.stringify([...statuses]),
    ).toBe(true);
    // Both kinds of outcome happened: the damage is neither always fatal nor always harmless.
    expect(statuses.get(201)).toBeGreaterThan(0);
    expect(statuses.get(422)).toBeGreaterThan(0);
    expect(await count('runs')).toBe(imported);
    await expectEveryRunWhole(dataDir);
    expect((await request(app).get('/api/health')).status).toBe(200);
    expect((await request(app).get('/api/runs').set(auth)).status).toBe(200);
  }, 600_000);
});

describe('security basics', () => {
  it('answers carry hardening headers', async () => {
    const { app } = freshApp();
    const res = await request(app).get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toMatch(/default-src 'self'/);
    expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('no error body carries a stack trace, and no answer carries a password or its hash', async () => {
    const { app } = freshApp();
    const { auth, password, user } = await bearer(app);
    const answers = [
      await request(app).post('/api/auth/login').send({ email: user.email, password }),
      await request(app).get('/api/me').set(auth),
      await request(app).get('/api/auth/me').set(auth),
      await request(app).post('/api/auth/login').set('Content-Type', 'application/json').send('{"broken'),
      await request(app).get('/api/runs/not-an-id').set(auth),
      await request(app).post('/api/runs').set(auth).attach('files', Buffer.from('<gpx><trk><trkseg><trkpt'), 'x.gpx'),
    ];
    for (const res of answers) {
      const body = JSON.stringify(res.body);
      expect(body).not.toMatch(/at .*\.ts:\d+|node_modules|stack/i);
      expect(body).not.toContain(password);
      expect(body).not.toMatch(/password_hash|\$2[aby]\$/);
    }
  });
});
