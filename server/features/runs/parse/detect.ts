import { gunzipSync } from 'node:zlib';
import { ImportRejection } from './import-rejection.ts';
import type { XmlBytes } from './xml-events.ts';

/** Largest uncompressed document accepted, bytes (a 100-mile 1 s GPX is about 25 MB). */
export const MAX_DOCUMENT_BYTES = 150 * 1024 * 1024;

export type TrackFormat = 'gpx' | 'tcx';

const NOT_A_TRACK = 'This file is not a GPS track: Pacewright reads GPX and TCX files from a watch or app.';

function startsWith(buffer: Buffer, bytes: readonly number[], offset = 0): boolean {
  if (buffer.length < offset + bytes.length) return false;
  return bytes.every((b, i) => buffer[offset + i] === b);
}

/**
 * Undo gzip when the content starts with the gzip magic bytes (1f 8b), whatever the file is
 * called, with a cap on the uncompressed size so a small "gzip bomb" cannot exhaust memory.
 */
export function gunzipIfNeeded(buffer: Buffer, maxBytes = MAX_DOCUMENT_BYTES): Buffer {
  if (!startsWith(buffer, [0x1f, 0x8b])) return buffer;
  try {
    return gunzipSync(buffer, { maxOutputLength: maxBytes });
  } catch (error) {
    if (error instanceof RangeError || (error as { code?: string }).code === 'ERR_BUFFER_TOO_LARGE') {
      throw new ImportRejection('too-large', 'This file is too large once uncompressed to be one run.');
    }
    throw new ImportRejection('damaged-gzip', 'This compressed file is damaged or incomplete, so it cannot be opened.');
  }
}

/** Refuse well-known binary formats by their magic bytes, with a sentence naming what it looks like. */
export function rejectBinary(buffer: Buffer): void {
  const image =
    startsWith(buffer, [0xff, 0xd8, 0xff]) || // JPEG
    startsWith(buffer, [0x89, 0x50, 0x4e, 0x47]) || // PNG
    startsWith(buffer, [0x47, 0x49, 0x46, 0x38]) || // GIF
    (startsWith(buffer, [0x52, 0x49, 0x46, 0x46]) && startsWith(buffer, [0x57, 0x45, 0x42, 0x50], 8)) || // WebP
    (startsWith(buffer, [0x00, 0x00, 0x00], 0) && startsWith(buffer, [0x66, 0x74, 0x79, 0x70], 4)); // HEIC/MP4
  if (image) throw new ImportRejection('not-a-track', 'This file is not a GPS track (it looks like an image).');
  if (startsWith(buffer, [0x25, 0x50, 0x44, 0x46])) {
    throw new ImportRejection('not-a-track', 'This file is not a GPS track (it looks like a PDF document).');
  }
  if (startsWith(buffer, [0x50, 0x4b, 0x03, 0x04])) {
    throw new ImportRejection(
      'not-a-track',
      'This file is a zip archive, not a single GPS track; upload the GPX or TCX files inside it.',
    );
  }
  if (startsWith(buffer, [0x2e, 0x46, 0x49, 0x54], 8)) {
    throw new ImportRejection(
      'not-a-track',
      'This is a FIT file; export the run from your watch or app as GPX or TCX and upload that.',
    );
  }
}

/**
 * Decode the bytes to text using the XML declaration's encoding (UTF-8 by default; ISO-8859-1,
 * Latin-1 and Windows-1252 as Latin-1; UTF-16 by its byte-order mark). A UTF-8 BOM is removed.
 * The import itself reads bytes (`xmlBytesOf`) and decodes only what saxes reads; this gives the
 * same text as decoding those bytes.
 */
export function decodeXml(buffer: Buffer): string {
  const { bytes, encoding } = xmlBytesOf(buffer);
  return bytes.toString(encoding);
}

/**
 * The document's bytes in an encoding whose ASCII bytes are ASCII characters, as `decodeXml`
 * would read them: Latin-1 when the XML declaration names ISO-8859-1, Latin-1, Windows-1252 or
 * ASCII, UTF-16 (by its byte-order mark) converted to UTF-8, else UTF-8 without its BOM.
 */
export function xmlBytesOf(buffer: Buffer): XmlBytes {
  if (startsWith(buffer, [0xff, 0xfe])) return utf8Of(new TextDecoder('utf-16le').decode(buffer.subarray(2)));
  if (startsWith(buffer, [0xfe, 0xff])) return utf8Of(new TextDecoder('utf-16be').decode(buffer.subarray(2)));
  const head = buffer.subarray(0, 200).toString('latin1');
  const encoding = /^\s*<\?xml[^>]*encoding\s*=\s*["']([\w.-]+)["']/i.exec(head)?.[1]?.toLowerCase();
  if (encoding && /^(iso-8859-1|iso8859-1|latin-?1|windows-1252|cp1252|us-ascii|ascii)$/.test(encoding)) {
    return { bytes: buffer, encoding: 'latin1' };
  }
  // The UTF-8 byte-order mark, which decoding would give as U+FEFF.
  return { bytes: startsWith(buffer, [0xef, 0xbb, 0xbf]) ? buffer.subarray(3) : buffer, encoding: 'utf8' };
}

function utf8Of(text: string): XmlBytes {
  // A decoded BOM at the start (a doubled mark) stays, as decoding keeps it.
  return { bytes: Buffer.from(text, 'utf8'), encoding: 'utf8' };
}

/** Longest UTF-8 encoding of one UTF-16 code unit: enough bytes for `count` characters. */
const MAX_BYTES_PER_CHAR = 3;

/** The first `count` characters of the document (as `text.slice(0, count)` of its decoded text). */
function firstChars({ bytes, encoding }: XmlBytes, count: number): string {
  return bytes.toString(encoding, 0, Math.min(bytes.length, count * MAX_BYTES_PER_CHAR + 4)).slice(0, count);
}

/** The last `count` characters of the document (as `text.slice(-count)`); a character cut at the start falls outside. */
function lastChars({ bytes, encoding }: XmlBytes, count: number): string {
  return bytes.toString(encoding, Math.max(0, bytes.length - count * MAX_BYTES_PER_CHAR - 4)).slice(-count);
}

const LOWER_CASE_BIT = 0x20;

/** True when bytes at `at` spell `word` (upper-case ASCII letters) in any case, as /word/i does. */
function wordAt(bytes: Buffer, at: number, word: string): boolean {
  for (let k = 0; k < word.length; k++) {
    const code = bytes[at + k];
    if (code === undefined || (code | LOWER_CASE_BIT) !== (word.charCodeAt(k) | LOWER_CASE_BIT)) return false;
  }
  return true;
}

const EXCLAMATION = 0x21;
const LESS_THAN = 0x3c;

/**
 * The first `<!` at or after `from` (as `bytes.indexOf('<!', from)`), found by its `!`: a single
 * byte is searched several times faster, and `!` is rare in a track.
 */
function markupDeclarationAt(bytes: Buffer, from: number): number {
  for (let at = bytes.indexOf(EXCLAMATION, from + 1); at !== -1; at = bytes.indexOf(EXCLAMATION, at + 1)) {
    if (bytes[at - 1] === LESS_THAN) return at - 1;
  }
  return -1;
}

/**
 * Whether the document declares an entity (`/<!ENTITY/i`) or names an external DTD
 * (`/<!DOCTYPE[^>[]*\b(?:SYSTEM|PUBLIC)\b/i`), as those expressions find on its decoded text,
 * found on the bytes: every `<!` is looked at, and only a DOCTYPE's own words are decoded.
 */
function declarationsOf(doc: XmlBytes): { entity: boolean; externalDtd: boolean } {
  const { bytes, encoding } = doc;
  let entity = false;
  let externalDtd = false;
  /** Where the next '>' and '[' are, found once per stretch so many DOCTYPEs cost one pass. */
  let nextClose = -2;
  let nextBracket = -2;
  for (let at = markupDeclarationAt(bytes, 0); at !== -1 && !(entity && externalDtd); at = markupDeclarationAt(bytes, at + 2)) {
    // Letters only: any of a-z A-Z matched ignoring case here is what /i matches without /u (ASCII to ASCII only).
    if (wordAt(bytes, at + 2, 'ENTITY')) entity = true;
    else if (!externalDtd && wordAt(bytes, at + 2, 'DOCTYPE')) {
      if (nextClose !== -1 && nextClose < at) nextClose = bytes.indexOf(0x3e /* > */, at);
      if (nextBracket !== -1 && nextBracket < at) nextBracket = bytes.indexOf(0x5b /* [ */, at);
      const ends = [nextClose, nextBracket].filter((end) => end !== -1);
      const end = ends.length ? Math.min(...ends) : bytes.length;
      // From DOCTYPE's last letter, so a word glued to it ("<!DOCTYPESYSTEM") has no boundary, as in the text.
      externalDtd = /\b(?:SYSTEM|PUBLIC)\b/i.test(bytes.toString(encoding, at + 8, end));
    }
  }
  return { entity, externalDtd };
}

/**
 * Decide from the content whether a document is GPX or TCX, refusing HTML, other XML, entity
 * declarations (XML bombs and external entities are never expanded or fetched), references to an
 * external DTD and documents cut off before their root element closes.
 */
export function detectFormat(doc: XmlBytes): TrackFormat {
  const head = firstChars(doc, 4096);
  if (/^\s*<!doctype\s+html|<html[\s>]/i.test(head)) {
    throw new ImportRejection('not-a-track', 'This file is not a GPS track (it looks like a web page, HTML).');
  }
  const declarations = declarationsOf(doc);
  if (declarations.entity) {
    throw new ImportRejection(
      'xml-entities',
      'This file declares XML entities, which Pacewright never expands for safety; export the run again from your watch or app.',
    );
  }
  // Nothing here fetches a DTD, but a track never needs one: refusing it keeps a future parser honest too.
  if (declarations.externalDtd) {
    throw new ImportRejection(
      'xml-external-dtd',
      'This file refers to an outside XML document type (DTD), which Pacewright never fetches for safety; export the run again from your watch or app.',
    );
  }
  const root = findRootName(head);
  if (root === null) throw new ImportRejection('not-a-track', NOT_A_TRACK);
  const local = root.includes(':') ? root.slice(root.indexOf(':') + 1) : root;
  let format: TrackFormat;
  if (local === 'gpx') format = 'gpx';
  else if (local === 'TrainingCenterDatabase') format = 'tcx';
  else if (local.toLowerCase() === 'html') {
    throw new ImportRejection('not-a-track', 'This file is not a GPS track (it looks like a web page, HTML).');
  } else if (local === 'kml') {
    throw new ImportRejection('not-a-track', 'This is a KML file, which has no timing; export the run as GPX or TCX.');
  } else throw new ImportRejection('not-a-track', NOT_A_TRACK);

  const closing = new RegExp(`</(?:[\\w.-]+:)?${local}\\s*>\\s*(?:<!--[\\s\\S]*?-->\\s*)*$`);
  if (!closing.test(lastChars(doc, 512))) {
    throw new ImportRejection(
      'truncated',
      'This file is incomplete: it ends before the track is closed, so the export or the upload was probably cut short.',
    );
  }
  return format;
}

/** Bytes that hold the first 4 096 characters `detectFormat` looks at, in any encoding `xmlBytesOf` gives. */
export const HEAD_BYTES = 4096 * MAX_BYTES_PER_CHAR + 4;

/**
 * The format `detectFormat` would find from the document's first HEAD_BYTES alone (its root element),
 * or null when that head looks like no track: the streaming reader's guess (parse-track-file.ts), which
 * `detectFormat` confirms on the whole document once it has arrived.
 */
export function formatFromHead(doc: XmlBytes): TrackFormat | null {
  const head = firstChars(doc, 4096);
  if (/^\s*<!doctype\s+html|<html[\s>]/i.test(head)) return null;
  const root = findRootName(head);
  if (root === null) return null;
  const local = root.includes(':') ? root.slice(root.indexOf(':') + 1) : root;
  return local === 'gpx' ? 'gpx' : local === 'TrainingCenterDatabase' ? 'tcx' : null;
}

function findRootName(head: string): string | null {
  const re = /<([^?!\s/>][^\s/>]*)/g;
  let pos = 0;
  for (;;) {
    const lt = head.indexOf('<', pos);
    if (lt === -1) return null;
    if (head.startsWith('<?', lt)) pos = head.indexOf('?>', lt) + 2;
    else if (head.startsWith('<!--', lt)) pos = head.indexOf('-->', lt) + 3;
    else if (head.startsWith('<!', lt)) pos = head.indexOf('>', lt) + 1;
    else {
      re.lastIndex = lt;
      return re.exec(head)?.[1] ?? null;
    }
    if (pos <= 1) return null;
  }
}
