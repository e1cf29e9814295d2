import yauzl, { type Entry, type ZipFile } from 'yauzl';

/** One central-directory entry: its place in the archive, its decoded name and sizes. */
export interface ZipEntryInfo {
  position: number;
  name: string;
  isDirectory: boolean;
  isEncrypted: boolean;
  compressedSize: number;
  uncompressedSize: number;
  entry: Entry;
}

/**
 * Opens a zip for reading entry by entry (lazyEntries). Names are left raw so that one entry with a
 * hostile name (`../`, `C:\`) can be skipped on its own instead of failing the whole archive.
 */
export function openZip(file: string): Promise<ZipFile> {
  return yauzl.openPromise(file, { lazyEntries: true, autoClose: false, decodeStrings: false, validateEntrySizes: true });
}

function decodeName(entry: Entry): string {
  // With decodeStrings off, yauzl leaves the name as bytes; decode as it would, keeping backslashes visible.
  return yauzl.getFileNameLowLevel(entry.generalPurposeBitFlag, entry.fileNameRaw, entry.extraFields, true);
}

/** The archive's entries in central-directory order, read one at a time. */
export async function* zipEntries(zip: ZipFile): AsyncGenerator<ZipEntryInfo> {
  let position = 0;
  while (true) {
    const entry = await new Promise<Entry | null>((resolve, reject) => {
      const cleanup = () => {
        zip.off('entry', onEntry);
        zip.off('end', onEnd);
        zip.off('error', onError);
      };
      const onEntry = (e: Entry) => {
        cleanup();
        resolve(e);
      };
      const onEnd = () => {
        cleanup();
        resolve(null);
      };
      const onError = (err: Error) => {
        cleanup();
        reject(err);
      };
      zip.on('entry', onEntry);
      zip.on('end', onEnd);
      zip.on('error', onError);
      zip.readEntry();
    });
    if (!entry) return;
    const name = decodeName(entry);
    yield {
      position: position++,
      name,
      isDirectory: name.endsWith('/'),
      isEncrypted: entry.isEncrypted(),
      compressedSize: entry.compressedSize,
      uncompressedSize: entry.uncompressedSize,
      entry,
    };
  }
}

/** The entry's content, refusing (by throwing) more than `maxBytes` whatever the header claims. */
export async function readZipEntry(zip: ZipFile, entry: Entry, maxBytes: number): Promise<Buffer> {
  if (entry.uncompressedSize > maxBytes) throw new Error('entry too large');
  const stream = await zip.openReadStreamPromise(entry);
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of stream as AsyncIterable<Buffer>) {
    size += chunk.length;
    if (size > maxBytes) {
      stream.destroy();
      throw new Error('entry too large');
    }
    chunks.push(chunk);
  }
  return Buffer.concat(chunks);
}
