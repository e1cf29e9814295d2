import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { decodeColumns, packColumns } from '../../server/features/runs/track-blob.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { createUser } from '../support/factories.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

// Issue 19, session 10: new tracks are stored as XOR byte planes (track-blob.ts) and their row says so
// (run_tracks.data_layout); every track stored before holds plain columns and must read exactly as it did.

const sample = (name: string) => readFileSync(path.resolve('fixtures/gps-samples', name));

describe('stored track layouts (run_tracks.data_layout)', () => {
  it('a new upload is stored as XOR planes; the same track rewritten as plain columns reads back the same series', async () => {
    const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-layouts-'));
    const app = createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
    const { user, password } = await createUser();
    const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
    const auth = { Authorization: `Bearer ${token}` };
    const res = await request(app).post('/api/runs').set(auth).attach('files', sample('run-hr-4s.gpx'), 'run-hr-4s.gpx');
    expect(res.status).toBe(201);
    const runId = res.body.imported[0].id as string;

    const row = await db('run_tracks').where({ run_id: runId }).first();
    expect(row?.data_layout).toBe('xor-planes');
    const columns = decodeColumns(row!.columns, row!.point_count, row!.data, 'xor-planes');
    expect(Object.keys(columns)).toEqual(row!.columns);
    expect(row!.point_count).toBeGreaterThan(100);
    const asPlanes = (await request(app).get(`/api/runs/${runId}/track`).set(auth)).body;
    expect(asPlanes.points).toBe(row!.point_count);
    expect(asPlanes.hr.some((v: number | null) => v !== null)).toBe(true);

    // The row as code before session 10 stored it: plain columns, zlib's default level, the column's default layout.
    const plain = packColumns(columns, 'columns');
    await db('run_tracks')
      .where({ run_id: runId })
      .update({ data: gzipSync(plain.raw, { level: 6 }), data_layout: db.raw('default') });
    const old = await db('run_tracks').where({ run_id: runId }).first();
    expect(old?.data_layout).toBe('columns');
    const asColumns = (await request(app).get(`/api/runs/${runId}/track`).set(auth)).body;
    expect(asColumns).toEqual(asPlanes);
    // And bit for bit, column by column.
    const back = decodeColumns(old!.columns, old!.point_count, old!.data, old!.data_layout);
    for (const name of row!.columns)
      expect(Buffer.compare(new Uint8Array(back[name]!.buffer), new Uint8Array(columns[name]!.buffer)), name).toBe(0);
  });

  it('a layout the code does not know is refused by the database', async () => {
    // CHECK constraints are tested as the row is formed, before the foreign key's trigger could say anything.
    await expect(
      db.raw(
        "insert into run_tracks (run_id, point_count, columns, data, data_layout) values (gen_random_uuid(), 0, '{}', ''::bytea, 'bytes')",
      ),
    ).rejects.toThrow(/check constraint/);
  });
});
