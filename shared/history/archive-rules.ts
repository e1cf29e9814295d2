/**
 * What a history archive may hold: limits checked before anything is stored, and the rule that
 * decides, from its name alone, whether one zip entry is a GPS file worth reading.
 */
import { CONTROL_CHARACTER } from '../api/text.ts';

/** Entries in one archive, at most. */
export const MAX_ARCHIVE_ENTRIES = 5000;
/** Sum of the entries' uncompressed sizes, bytes, at most (2 GiB). */
export const MAX_ARCHIVE_UNCOMPRESSED_BYTES = 2 * 1024 ** 3;
/** Uncompressed ÷ compressed size of one entry, at most: GPX and TCX compress about 5–20 : 1. */
export const MAX_COMPRESSION_RATIO = 200;
/** Entries smaller than this are never judged by ratio: a tiny file cannot exhaust anything. */
export const RATIO_CHECK_MIN_BYTES = 1024 * 1024;
/** The uploaded .zip itself, bytes, at most (1 GiB). */
export const MAX_ARCHIVE_UPLOAD_BYTES = 1024 ** 3;

/** Name endings of the files an archive may usefully hold (case does not matter). */
export const GPS_FILE_ENDINGS = ['.gpx', '.tcx', '.gpx.gz', '.tcx.gz'] as const;

const ARCHIVE_ENDINGS = ['.zip', '.gz', '.tgz', '.tar', '.7z', '.rar', '.bz2', '.xz', '.zst', '.jar'];

/**
 * Why an entry is skipped, as a sentence fragment for "name: reason", or null when it is a GPS file
 * to import. `name` is the entry's decoded path inside the archive. Folders are not judged here.
 */
export function entrySkipReason(name: string): string | null {
  if (name.includes('\0')) return 'a file name with a NUL character, skipped';
  // Bells, escapes and other invisible characters have no place in a file name a runner reads back.
  if (CONTROL_CHARACTER.test(name)) return 'a file name with an invisible control character, skipped';
  if (name.includes('\\')) return 'a file name with a backslash, skipped';
  if (name.startsWith('/') || /^[a-z]:/i.test(name)) return 'an absolute path, skipped';
  if (name.split('/').some((part) => part === '..')) return 'a path that climbs out of the archive (..), skipped';
  const lower = name.toLowerCase();
  if (GPS_FILE_ENDINGS.some((ending) => lower.endsWith(ending))) return null;
  if (ARCHIVE_ENDINGS.some((ending) => lower.endsWith(ending))) {
    return 'an archive inside the archive; unpack it and add its GPX or TCX files instead';
  }
  return 'not a GPS file (Pacewright reads .gpx, .tcx, .gpx.gz and .tcx.gz)';
}

/** Compression ratio of one entry; Infinity when something was compressed to nothing. */
export function compressionRatio(uncompressedBytes: number, compressedBytes: number): number {
  if (uncompressedBytes === 0) return 0;
  return compressedBytes === 0 ? Infinity : uncompressedBytes / compressedBytes;
}
