import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { generateLakeRun, longRunPhases, trueDistance } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

function freshApp() {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-data-'));
  return createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
}

async function bearer(app: ReturnType<typeof freshApp>) {
  const { user, password } = await createUser();
  const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
  return { Authorization: `Bearer ${token}` };
}

const GPX_HEAD = '<?xml version="1.0"?>';
const point = (t: string) => `<trkpt lat="46.2" lon="-31.4"><time>${t}</time></trkpt>`;

// Hostile or broken uploads: each is refused with a sentence, nothing is stored, the server keeps answering.
const HOSTILE: Array<[string, string | Buffer]> = [
  [
    'bomb.gpx',
    `${GPX_HEAD}<!DOCTYPE gpx [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;&a;&a;&a;&a;&a;&a;"><!ENTITY c "&b;&b;&b;&b;&b;&b;&b;&b;&b;&b;">]><gpx><trk><name>&c;</name><trkseg>${point('2026-01-01T00:00:00Z')}</trkseg></trk></gpx>`,
  ],
  [
    'external.gpx',
    `${GPX_HEAD}<!DOCTYPE gpx [<!ENTITY xxe SYSTEM "file:///etc/passwd">]><gpx><trk><name>&xxe;</name><trkseg>${point('2026-01-01T00:00:00Z')}${point('2026-01-01T00:00:05Z')}</trkseg></trk></gpx>`,
  ],
  ['truncated.gpx', `${GPX_HEAD}<gpx><trk><trkseg>${point('2026-01-01T00:00:00Z')}<trkpt lat="46.2"`],
  ['not-xml.tcx', 'lat,lon,time\n46.2,-31.4,2026-01-01T00:00:00Z\n'],
  ['bad.gpx.gz', Buffer.from([0x1f, 0x8b, 0x08, 0x00, 0x01, 0x02, 0x03])],
  [
    'nan.gpx',
    `${GPX_HEAD}<gpx><trk><trkseg><trkpt lat="NaN" lon="x"><time>2026-01-01T00:00:00Z</time></trkpt></trkseg></trk></gpx>`,
  ],
  ['single.gpx', `${GPX_HEAD}<gpx><trk><trkseg>${point('2026-01-01T00:00:00Z')}</trkseg></trk></gpx>`],
];

describe('POST /api/runs with hostile files', () => {
  it.each(HOSTILE)('%s is refused with a sentence and nothing is stored', async (name, content) => {
    const app = freshApp();
    const auth = await bearer(app);
    const res = await request(app).post('/api/runs').set(auth).attach('files', Buffer.from(content), name);
    expect(res.status).toBe(422);
    expect(res.body.rejected).toHaveLength(1);
    expect(res.body.rejected[0].error).toMatch(/^[A-Z][^<>]*\.$/);
    expect(res.body.rejected[0].error).not.toMatch(/root:|passwd/);
    expect(await db('runs').count({ n: '*' }).first()).toEqual({ n: '0' });
    expect((await request(app).get('/api/health')).status).toBe(200);
  });

  it('a 100-mile run recorded every second (about 100 000 points) imports within the request limits', async () => {
    const app = freshApp();
    const auth = await bearer(app);
    // 29 hours at 1.6 m/s with a one-minute stop each hour: 164.3 km, 102 miles.
    const phases = longRunPhases(29, 1.6);
    const run = generateLakeRun({ start_t: Date.UTC(2026, 5, 20, 4), phases, seed: 5, gps_sigma_m: 1 });
    expect(run.points.length).toBeGreaterThan(100_000);
    const gpx = gzipSync(writeGpx('Hundred-mile lake loops', [run.points]));
    const res = await request(app).post('/api/runs').set(auth).attach('files', gpx, 'hundred.gpx.gz');
    expect(res.status).toBe(201);
    const imported = res.body.imported[0];
    expect(imported.distance_m / 1609.344).toBeGreaterThan(100);
    expect(Math.abs(imported.distance_m / trueDistance(phases) - 1)).toBeLessThan(0.005);
    const detail = await request(app).get(`/api/runs/${imported.id}`).set(auth);
    expect(detail.body.splits.mi.length).toBe(Math.ceil(imported.distance_m / 1609.344));
  }, 60_000);
});
