import { gunzipSync } from 'node:zlib';
import { ImportRejection } from './import-rejection.ts';

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
 */
export function decodeXml(buffer: Buffer): string {
  if (startsWith(buffer, [0xff, 0xfe])) return new TextDecoder('utf-16le').decode(buffer.subarray(2));
  if (startsWith(buffer, [0xfe, 0xff])) return new TextDecoder('utf-16be').decode(buffer.subarray(2));
  const head = buffer.subarray(0, 200).toString('latin1');
  const encoding = /^\s*<\?xml[^>]*encoding\s*=\s*["']([\w.-]+)["']/i.exec(head)?.[1]?.toLowerCase();
  if (encoding && /^(iso-8859-1|iso8859-1|latin-?1|windows-1252|cp1252|us-ascii|ascii)$/.test(encoding)) {
    return buffer.toString('latin1');
  }
  const text = buffer.toString('utf8');
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/**
 * Decide from the content whether a document is GPX or TCX, refusing HTML, other XML, entity
 * declarations (XML bombs and external entities are never expanded or fetched), references to an
 * external DTD and documents cut off before their root element closes.
 */
export function detectFormat(text: string): TrackFormat {
  const head = text.slice(0, 4096);
  if (/^\s*<!doctype\s+html|<html[\s>]/i.test(head)) {
    throw new ImportRejection('not-a-track', 'This file is not a GPS track (it looks like a web page, HTML).');
  }
  if (/<!ENTITY/i.test(text)) {
    throw new ImportRejection(
      'xml-entities',
      'This file declares XML entities, which Pacewright never expands for safety; export the run again from your watch or app.',
    );
  }
  // Nothing here fetches a DTD, but a track never needs one: refusing it keeps a future parser honest too.
  if (/<!DOCTYPE[^>[]*\b(?:SYSTEM|PUBLIC)\b/i.test(text)) {
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
  if (!closing.test(text.slice(-512))) {
    throw new ImportRejection(
      'truncated',
      'This file is incomplete: it ends before the track is closed, so the export or the upload was probably cut short.',
    );
  }
  return format;
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
