import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { createUser } from '../support/factories.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

const sample = (name: string) => readFileSync(path.resolve('fixtures/gps-samples', name));

function binary(res: request.Test) {
  return res.buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => cb(null, Buffer.concat(chunks)));
  });
}

// Issue 13 #14: a file uploaded as `page.html` was served back as text/html (Express's attachment() took the type
// from the name's extension). The type now comes from the stored bytes and the detected format.
describe('GET /api/runs/:id/original', () => {
  it.each<[string, string, Buffer, string]>([
    ['GPX named .html', 'application/gpx+xml', sample('run-hr-4s.gpx'), 'page.html'],
    ['TCX named .svg', 'application/octet-stream', sample('watch-run-3-laps.tcx'), 'image.svg'],
    ['gzipped GPX named .js', 'application/gzip', gzipSync(sample('run-excerpt-3-segments.gpx')), 'script.js'],
  ])('a %s is served as %s, an attachment, never sniffed', async (_name, type, bytes, uploadedAs) => {
    const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-original-'));
    const app = createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
    const { user, password } = await createUser();
    const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
    const auth = { Authorization: `Bearer ${token}` };
    const upload = await request(app).post('/api/runs').set(auth).attach('files', bytes, uploadedAs);
    expect(upload.status).toBe(201);

    const res = await binary(request(app).get(`/api/runs/${upload.body.imported[0].id}/original`).set(auth));

    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe(type);
    expect(res.headers['content-type']).not.toMatch(/html|svg|javascript/);
    expect(res.headers['content-disposition']).toMatch(
      new RegExp(`^attachment; filename="?${uploadedAs.replace('.', '\\.')}"?$`),
    );
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(Buffer.compare(res.body as Buffer, bytes)).toBe(0);
  });
});
