import { mkdtempSync, readFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
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

  it('20 different files at once give 20 runs', async () => {
    const { app } = freshApp();
    const { auth } = await bearer(app);
    const files = Array.from({ length: 20 }, (_, i) => {
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
    expect(results.every((r) => r.status === 201)).toBe(true);
    expect(await count('runs')).toBe(20);
  });
});

describe('fuzzed uploads', () => {
  // Random damage to real device files: truncation, byte flips, swapped tags, huge numbers (seeded, so repeatable).
  const SAMPLES = ['run-hr-4s.gpx', 'watch-run-3-laps.tcx', 'ride-1s-4-segments.gpx'].map((f) =>
    readFileSync(`fixtures/gps-samples/${f}`, 'utf8'),
  );
  function mutate(text: string, random: () => number): string {
    const at = Math.floor(random() * text.length);
    switch (Math.floor(random() * 5)) {
      case 0:
        return text.slice(0, at);
      case 1:
        return text.slice(0, at) + String.fromCharCode(Math.floor(random() * 256)) + text.slice(at + 1);
      case 2:
        return text.replace('<trkpt', '<rtept').replace('</trkseg>', '</trk>');
      case 3:
        return text.replace(/<ele>[^<]*<\/ele>/, '<ele>1e308</ele>').replace(/lat="[^"]*"/, 'lat="99999999999999999999"');
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

  it('200 mutated files: never a 500, never a half-stored run, and the server answers afterwards', async () => {
    const { app } = freshApp();
    const { auth } = await bearer(app);
    const random = createPrng(2026);
    let imported = 0;
    for (let i = 0; i < 200; i++) {
      const text = mutate(mutate(SAMPLES[i % SAMPLES.length]!, random), random);
      const res = await request(app).post('/api/runs').set(auth).attach('files', Buffer.from(text), `fuzz-${i}.gpx`);
      expect([201, 422]).toContain(res.status);
      if (res.status === 422 && res.body.rejected.length) expect(res.body.rejected[0].error).toMatch(/\.$/);
      imported += res.body.imported?.length ?? 0;
    }
    // Every stored run is whole: it has its track and its splits rows agree with its distance.
    expect(await count('runs')).toBe(await count('run_tracks'));
    expect(await count('runs')).toBeLessThanOrEqual(imported);
    expect((await request(app).get('/api/health')).status).toBe(200);
  }, 120_000);
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
