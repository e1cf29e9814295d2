import { mkdtempSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createFsStore, createS3Store, createStoreFromEnv, type FileStore } from '../../server/lib/storage.ts';

// The S3 adapter talks to s3rver, a local S3 fake on loopback — never a real cloud.
let s3rver: S3rver;
let endpoint: string;

beforeAll(async () => {
  s3rver = new S3rver({
    address: '127.0.0.1',
    port: 0,
    silent: true,
    directory: mkdtempSync(path.join(tmpdir(), 'pacewright-s3-')),
    configureBuckets: [{ name: 'originals', configs: [] }],
  });
  const address: AddressInfo = await s3rver.run();
  endpoint = `http://127.0.0.1:${address.port}`;
});

afterAll(async () => {
  await s3rver?.close();
});

async function roundTrip(store: FileStore) {
  const bytes = Buffer.from([0x1f, 0x8b, 0, 1, 2, 3, 255]);
  await store.put('user-1/abc123', bytes);
  expect(Buffer.compare(await store.get('user-1/abc123'), bytes)).toBe(0);
  await store.delete('user-1/abc123');
  await expect(store.get('user-1/abc123')).rejects.toThrow();
  await expect(store.put('../escape', bytes)).rejects.toThrow(/unsafe/);
}

describe('file storage adapters', () => {
  it('local disk keeps files byte for byte and refuses path tricks', async () => {
    await roundTrip(createFsStore(mkdtempSync(path.join(tmpdir(), 'pacewright-fs-'))));
  });

  it('S3-compatible storage keeps files byte for byte (against s3rver)', async () => {
    const store = await createS3Store({
      bucket: 'originals',
      region: 'us-east-1',
      endpoint,
      forcePathStyle: true,
      credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
      prefix: 'test/',
    });
    await roundTrip(store);
  });

  it('STORAGE chooses the adapter and explains a missing bucket', async () => {
    await expect(createStoreFromEnv('/tmp', { STORAGE: 's3' })).rejects.toThrow(/S3_BUCKET/);
    await expect(createStoreFromEnv('/tmp', { STORAGE: 'ftp' })).rejects.toThrow(/fs or s3/);
  });
});
