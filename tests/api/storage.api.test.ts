import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
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

const s3Options = (url: string) => ({
  bucket: 'originals',
  region: 'us-east-1',
  endpoint: url,
  forcePathStyle: true,
  credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
});

/** An s3rver on a free loopback port that prints the port and lives until its parent kills it. */
const S3RVER_CHILD = `
import S3rver from 's3rver';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
const server = new S3rver({ address: '127.0.0.1', port: 0, silent: true,
  directory: mkdtempSync(path.join(tmpdir(), 'pacewright-s3-paged-')), configureBuckets: [{ name: 'originals', configs: [] }] });
const address = await server.run();
process.stdout.write(address.port + '\\n');
`;

async function listAll(store: FileStore) {
  const files = [];
  for await (const file of store.list()) files.push(file);
  return files;
}

describe('file storage adapters', () => {
  it('local disk keeps files byte for byte and refuses path tricks', async () => {
    await roundTrip(createFsStore(mkdtempSync(path.join(tmpdir(), 'pacewright-fs-'))));
  });

  it('local disk stores a waiting upload from its path byte for byte, and keeps it once the upload is removed', async () => {
    const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-fs-'));
    const store = createFsStore(dataDir);
    const upload = path.join(dataDir, 'upload-1.part');
    const bytes = Buffer.from(Array.from({ length: 70_000 }, (_, k) => (k * 31) % 256));
    writeFileSync(upload, bytes);
    await store.putFile!('user-1/def456', upload);
    rmSync(upload);
    expect(Buffer.compare(await store.get('user-1/def456'), bytes)).toBe(0);
    // A folder emptied by delete is made again; unsafe keys are refused as by put.
    await store.delete('user-1/def456');
    writeFileSync(upload, bytes);
    await store.putFile!('user-1/def456', upload);
    expect((await store.get('user-1/def456')).length).toBe(bytes.length);
    // A file of that key left half-written by an interrupted upload is replaced by the whole upload.
    rmSync(upload);
    writeFileSync(path.join(dataDir, 'files', 'user-1', 'def456'), bytes.subarray(0, 100));
    writeFileSync(upload, bytes);
    await store.putFile!('user-1/def456', upload);
    rmSync(upload);
    expect(Buffer.compare(await store.get('user-1/def456'), bytes)).toBe(0);
    await expect(store.putFile!('../escape', upload)).rejects.toThrow(/unsafe/);
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

  it('local disk lists every stored file with its key and last-write time', async () => {
    const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-fs-'));
    const store = createFsStore(dataDir);
    expect(await listAll(store)).toEqual([]); // nothing stored yet: no files folder at all
    // The write time must fall between the clock read before and after the write (file systems keep whole
    // seconds at worst, hence the second either side), however long the write took on a busy machine.
    const beforeWrite = Date.now() - 1000;
    await store.put('user-1/abc', Buffer.from('a'));
    await store.put('user-2/def', Buffer.from('b'));
    const afterWrite = Date.now() + 1000;
    const anHourAgo = new Date(beforeWrite - 3600_000);
    utimesSync(path.join(dataDir, 'files/user-1/abc'), anHourAgo, anHourAgo);
    const listed = await listAll(store);
    expect(listed.map((f) => f.key).sort()).toEqual(['user-1/abc', 'user-2/def']);
    expect(Math.abs(listed.find((f) => f.key === 'user-1/abc')!.modifiedAt.getTime() - anHourAgo.getTime())).toBeLessThan(1000);
    const written = listed.find((f) => f.key === 'user-2/def')!.modifiedAt.getTime();
    expect(written).toBeGreaterThanOrEqual(beforeWrite);
    expect(written).toBeLessThanOrEqual(afterWrite);
  });

  it('S3-compatible storage lists the keys inside its prefix only, with their times (against s3rver)', async () => {
    const store = await createS3Store({ ...s3Options(endpoint), prefix: 'listed/' });
    const neighbour = await createS3Store({ ...s3Options(endpoint), prefix: 'elsewhere/' });
    const keys = ['u1/a', 'u1/b', 'u2/c'];
    // S3 keeps whole seconds: each time must fall between the clock read before and after the writes, ± 1 s.
    const beforeWrite = Date.now() - 1000;
    for (const key of keys) await store.put(key, Buffer.from(key));
    const afterWrite = Date.now() + 1000;
    await neighbour.put('u1/a', Buffer.from('not ours'));
    const listed = await listAll(store);
    expect(listed.map((f) => f.key).sort()).toEqual(keys);
    for (const file of listed) {
      expect(file.modifiedAt.getTime()).toBeGreaterThanOrEqual(beforeWrite);
      expect(file.modifiedAt.getTime()).toBeLessThanOrEqual(afterWrite);
    }
    await store.delete('u1/b');
    expect((await listAll(store)).map((f) => f.key).sort()).toEqual(['u1/a', 'u2/c']);
  });

  it('S3-compatible storage follows continuation tokens through every page (against s3rver)', async () => {
    // s3rver makes continuation tokens with DES, which Node 20's OpenSSL 3 only offers with its legacy
    // provider; so this s3rver runs in a child process started with that flag.
    const child = spawn(process.execPath, ['--openssl-legacy-provider', '--input-type=module', '-e', S3RVER_CHILD], {
      cwd: process.cwd(),
      stdio: ['pipe', 'pipe', 'inherit'],
    });
    try {
      const port = await new Promise<number>((resolve, reject) => {
        child.stdout.once('data', (chunk: Buffer) => resolve(Number(chunk.toString().trim())));
        child.once('exit', (code) => reject(new Error(`s3rver child exited early (${code})`)));
      });
      const store = await createS3Store({ ...s3Options(`http://127.0.0.1:${port}`), prefix: 'paged/', listPageSize: 2 });
      const keys = ['u1/a', 'u1/b', 'u2/c', 'u2/d', 'u3/e'];
      for (const key of keys) await store.put(key, Buffer.from(key));
      // Five keys in pages of two: three listing requests, each continuing where the last one stopped.
      expect((await listAll(store)).map((f) => f.key).sort()).toEqual(keys);
    } finally {
      child.kill('SIGKILL');
    }
  }, 30_000);

  it('STORAGE chooses the adapter and explains a missing bucket', async () => {
    await expect(createStoreFromEnv('/tmp', { STORAGE: 's3' })).rejects.toThrow(/S3_BUCKET/);
    await expect(createStoreFromEnv('/tmp', { STORAGE: 'ftp' })).rejects.toThrow(/fs or s3/);
  });
});
