import { mkdir, readFile, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';

/** Where original files are kept byte for byte. Keys are relative paths made by the app, never by users. */
export interface FileStore {
  put(key: string, data: Buffer): Promise<void>;
  get(key: string): Promise<Buffer>;
  delete(key: string): Promise<void>;
}

const SAFE_KEY = /^[a-z0-9][a-z0-9/_.-]*$/i;

function checkKey(key: string): void {
  if (!SAFE_KEY.test(key) || key.split('/').includes('..')) throw new Error(`unsafe storage key: ${key}`);
}

/** Local disk under `DATA_DIR/files` (the default). */
export function createFsStore(dataDir: string): FileStore {
  const root = path.join(dataDir, 'files');
  const resolve = (key: string) => {
    checkKey(key);
    return path.join(root, key);
  };
  return {
    async put(key, data) {
      const file = resolve(key);
      await mkdir(path.dirname(file), { recursive: true });
      await writeFile(file, data);
    },
    async get(key) {
      return readFile(resolve(key));
    },
    async delete(key) {
      await rm(resolve(key), { force: true });
    },
  };
}

export interface S3StoreOptions {
  bucket: string;
  region: string;
  endpoint?: string;
  forcePathStyle?: boolean;
  credentials?: { accessKeyId: string; secretAccessKey: string };
  /** Prefix inside the bucket, e.g. `originals/`. */
  prefix?: string;
}

/** S3-compatible object storage (`STORAGE=s3`). Tested against a local fake (s3rver), never a real cloud. */
export async function createS3Store(options: S3StoreOptions): Promise<FileStore> {
  const { S3Client, PutObjectCommand, GetObjectCommand, DeleteObjectCommand } = await import('@aws-sdk/client-s3');
  const client = new S3Client({
    region: options.region,
    endpoint: options.endpoint,
    forcePathStyle: options.forcePathStyle,
    credentials: options.credentials,
  });
  const objectKey = (key: string) => {
    checkKey(key);
    return (options.prefix ?? '') + key;
  };
  return {
    async put(key, data) {
      await client.send(new PutObjectCommand({ Bucket: options.bucket, Key: objectKey(key), Body: data }));
    },
    async get(key) {
      const out = await client.send(new GetObjectCommand({ Bucket: options.bucket, Key: objectKey(key) }));
      return Buffer.from(await out.Body!.transformToByteArray());
    },
    async delete(key) {
      await client.send(new DeleteObjectCommand({ Bucket: options.bucket, Key: objectKey(key) }));
    },
  };
}

/** The store chosen by `STORAGE` (`fs`, the default, or `s3` with the usual S3 variables). */
export async function createStoreFromEnv(dataDir: string, env: NodeJS.ProcessEnv = process.env): Promise<FileStore> {
  if ((env.STORAGE ?? 'fs') === 'fs') return createFsStore(dataDir);
  if (env.STORAGE !== 's3') throw new Error(`STORAGE must be fs or s3, not ${env.STORAGE}`);
  if (!env.S3_BUCKET) throw new Error('STORAGE=s3 needs S3_BUCKET (and AWS_REGION, credentials, optionally S3_ENDPOINT).');
  return createS3Store({
    bucket: env.S3_BUCKET,
    region: env.AWS_REGION ?? 'us-east-1',
    endpoint: env.S3_ENDPOINT,
    forcePathStyle: Boolean(env.S3_ENDPOINT),
    prefix: env.S3_PREFIX,
  });
}
