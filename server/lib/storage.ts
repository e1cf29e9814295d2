import { copyFile, link, mkdir, opendir, readFile, rm, rmdir, stat, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { StoredFileInfo } from '../../shared/runs/orphan-files.ts';

/** Where original files are kept byte for byte. Keys are relative paths made by the app, never by users. */
export interface FileStore {
  put(key: string, data: Buffer): Promise<void>;
  /**
   * Stores a file that waits on local disk (a streamed upload) without reading it into this process;
   * a store without it is given the file's bytes through `put`.
   */
  putFile?(key: string, sourcePath: string): Promise<void>;
  get(key: string): Promise<Buffer>;
  delete(key: string): Promise<void>;
  /** Every stored file with its last-write time, a page at a time (the orphan sweeper reads this). */
  list(): AsyncIterable<StoredFileInfo>;
}

const SAFE_KEY = /^[a-z0-9][a-z0-9/_.-]*$/i;

function checkKey(key: string): void {
  if (!SAFE_KEY.test(key) || key.split('/').includes('..')) throw new Error(`unsafe storage key: ${key}`);
}

/** Files under `dir`, depth first, streamed so a large store is never held in memory at once. */
async function* walkFiles(dir: string): AsyncGenerator<string> {
  let handle;
  try {
    handle = await opendir(dir);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return;
    throw err;
  }
  for await (const entry of handle) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) yield* walkFiles(full);
    else if (entry.isFile()) yield full;
  }
}

/** Why a hard link may be refused where a copy still works. */
const LINK_REFUSED = new Set(['EEXIST', 'EXDEV', 'EPERM', 'ENOTSUP', 'EOPNOTSUPP', 'EMLINK', 'EACCES']);

/** Local disk under `DATA_DIR/files` (the default). */
export function createFsStore(dataDir: string): FileStore {
  const root = path.join(dataDir, 'files');
  const resolve = (key: string) => {
    checkKey(key);
    return path.join(root, key);
  };
  /** Writes `key` with `write`; a folder emptied by `delete` may vanish between mkdir and write: make it again once. */
  const writeInFolder = async (key: string, write: (file: string) => Promise<void>) => {
    const file = resolve(key);
    for (let attempt = 0; ; attempt++) {
      await mkdir(path.dirname(file), { recursive: true });
      try {
        return await write(file);
      } catch (err) {
        if ((err as NodeJS.ErrnoException).code !== 'ENOENT' || attempt > 0) throw err;
      }
    }
  };
  return {
    put: (key, data) => writeInFolder(key, (file) => writeFile(file, data)),
    // A hard link: the stored name shares the waiting upload's bytes (uploads wait in DATA_DIR/uploads, the same
    // disk), nothing is copied, and the upload's own name is removed afterwards. Where a link cannot be made
    // (another filesystem, no links), or a file of that key is left from an interrupted upload, the kernel copies
    // it (copy_file_range/sendfile on Linux): a 25 MB upload is never read into the event loop's heap either way.
    putFile: (key, sourcePath) =>
      writeInFolder(key, async (file) => {
        try {
          await link(sourcePath, file);
        } catch (err) {
          if (!LINK_REFUSED.has((err as NodeJS.ErrnoException).code ?? '')) throw err;
          await copyFile(sourcePath, file);
        }
      }),
    async get(key) {
      return readFile(resolve(key));
    },
    async delete(key) {
      const file = resolve(key);
      await rm(file, { force: true });
      // The user's folder goes with its last file (issue 13 #15): no empty DATA_DIR/files/<uid>/ is left behind.
      const folder = path.dirname(file);
      if (folder !== root) await rmdir(folder).catch(() => undefined);
    },
    async *list() {
      for await (const file of walkFiles(root)) {
        // A file deleted between the walk and the stat is simply no longer there.
        const info = await stat(file).catch(() => null);
        if (info) yield { key: path.relative(root, file).split(path.sep).join('/'), modifiedAt: info.mtime };
      }
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
  /** Keys per listing request: S3's maximum of 1000 unless a test wants to see paging. */
  listPageSize?: number;
}

/** S3-compatible object storage (`STORAGE=s3`). Tested against a local fake (s3rver), never a real cloud. */
export async function createS3Store(options: S3StoreOptions): Promise<FileStore> {
  const { S3Client, PutObjectCommand, GetObjectCommand, DeleteObjectCommand, ListObjectsV2Command } =
    await import('@aws-sdk/client-s3');
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
    async *list() {
      const prefix = options.prefix ?? '';
      let continuationToken: string | undefined;
      do {
        const page = await client.send(
          new ListObjectsV2Command({
            Bucket: options.bucket,
            Prefix: prefix || undefined,
            MaxKeys: options.listPageSize ?? 1000,
            ContinuationToken: continuationToken,
          }),
        );
        for (const object of page.Contents ?? []) {
          if (object.Key === undefined || !object.Key.startsWith(prefix) || !object.LastModified) continue;
          yield { key: object.Key.slice(prefix.length), modifiedAt: object.LastModified };
        }
        continuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
      } while (continuationToken);
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
