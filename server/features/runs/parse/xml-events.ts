/**
 * The one place that tokenises XML for the track importer. Readers receive open/text/close
 * events with namespace prefixes removed, so the parser underneath can change without touching
 * them.
 *
 * It is saxes 6, a streaming, well-formedness-checking parser: no tree is built, so a 100-mile
 * 1 s GPX costs the points the readers keep and little else (see `npm run bench`). saxes never
 * reads a DTD's entity declarations nor fetches external entities; documents that declare
 * entities are refused before they get here (see detect.ts) and again here, and a reference to
 * any entity other than the five XML predefines it is an error, never an expansion.
 *
 * The track points, nearly all of a GPS file, may instead go through element-scanner.ts: a
 * strict reader of a plain subset of XML (no entities, comments, CDATA or DTD at all) that gives
 * the same events and leaves every point it does not fully accept to saxes.
 *
 * The document comes as its bytes and their encoding (detect.ts `xmlBytesOf`): the scanner reads
 * the points' bytes as they are, and only the stretches between them, the parts saxes reads, are
 * decoded to text. A 100-mile file is never decoded as a whole.
 */
import { SaxesParser, type SaxesTagPlain } from 'saxes';
import { documentBytes, ElementScanner, type ScannedElementSink } from './element-scanner.ts';
import type { TemplatePointReader } from './point-template.ts';
import type { PointTagCounter } from './point-tags.ts';

/** A document's bytes in an ASCII-compatible encoding (UTF-16 is converted to UTF-8 first, detect.ts). */
export interface XmlBytes {
  bytes: Buffer;
  encoding: 'utf8' | 'latin1';
  /**
   * Set while the document is still arriving (parse/arriving.ts): `bytes` is then the memory it arrives
   * in, longer than the document, with 0 where nothing has arrived yet, and the reader waits for bytes
   * before it reads them.
   */
  arriving?: ArrivingXml;
}

/** A document whose bytes are still arriving, as the reader sees it (parse/arriving.ts). */
export interface ArrivingXml {
  /**
   * Blocks until bytes[0, end) have arrived or the whole document has; gives how many bytes have
   * arrived (the document's length once all have). Throws `ArrivalStopped` when the bytes stop coming.
   */
  waitFor(end: number): number;
  /** The document's length once all of it has arrived, else −1. */
  readonly length: number;
}

/**
 * Bytes the reader has in hand past an element before it reads the element while the document is still
 * arriving: a track point is a few hundred bytes, so it is nearly always whole by then; one that is not
 * (the template and the scanner both refuse it) is tried again once the whole document has arrived.
 */
export const ARRIVAL_LOOKAHEAD_BYTES = 64 * 1024;

export interface XmlEventHandlers {
  /** An element starts; `name` has no namespace prefix; attribute names are unprefixed too. */
  open(name: string, attrs: Readonly<Record<string, string>>): void;
  /**
   * Text content of the innermost open element up to its next child or its end, trimmed and
   * never empty (CDATA sections join the text, comments are dropped). The five predefined
   * entities and numeric character references are decoded (`&amp;` → `&`); saxes reports any
   * other entity reference as undefined, which becomes an error: nothing is ever expanded.
   */
  text(value: string): void;
  close(name: string): void;
}

/** Nesting deeper than this is not a GPS file; refusing it keeps the walk bounded. */
const MAX_DEPTH = 64;

export class XmlReadError extends Error {}

function localName(name: string): string {
  const colon = name.indexOf(':');
  return colon === -1 ? name : name.slice(colon + 1);
}

/** Attribute names without prefixes and without namespace declarations; the same object when nothing changes. */
function localAttributes(attrs: Record<string, string>): Record<string, string> {
  let needsCopy = false;
  for (const name in attrs) {
    if (name.includes(':') || name === 'xmlns') {
      needsCopy = true;
      break;
    }
  }
  if (!needsCopy) return attrs;
  const local: Record<string, string> = {};
  for (const name in attrs) {
    if (name === 'xmlns' || name.startsWith('xmlns:')) continue;
    local[localName(name)] = attrs[name] as string;
  }
  return local;
}

/** How `readXmlEvents` may go faster on a particular kind of document. */
export interface XmlReadOptions {
  /**
   * The name (as written, with any prefix) of an element that repeats thousands of times, such as
   * a track point. Where one starts right after a tag (whitespace between), it is read by the
   * strict scanner of element-scanner.ts instead of saxes; anything the scanner does not accept
   * goes to saxes as usual. The events are the same either way.
   */
  repeatedElement?: string;
  /**
   * Reads repeated elements straight into the reader's columns, without events, where it can
   * (point-template.ts): offered every element the scanner would be tried on, and every element
   * the scanner accepts, to learn from. What it does not read goes the usual way.
   */
  pointReader?: TemplatePointReader;
  /**
   * Told how far the document has been read before saxes or the scanner's events see it, so the
   * point tags are counted in the same pass (point-tags.ts); the point reader tells it of its own points.
   */
  pointTags?: PointTagCounter;
  /** Tests: bytes in hand past an element before it is read while the document arrives (ARRIVAL_LOOKAHEAD_BYTES). */
  arrivalLookahead?: number;
}

/**
 * Read a whole XML document as events, in document order, while checking that it is
 * well-formed. Throws `XmlReadError` when it is not (mismatched or unclosed tags, a truncated
 * document, an undefined entity, an entity declaration, nesting deeper than 64 elements).
 * Errors thrown by the handlers pass through unchanged. Returns how many repeated elements the
 * scanner read (the rest of the document went through saxes). A string is read as its UTF-8 bytes.
 */
export function readXmlEvents(xml: string | XmlBytes, handlers: XmlEventHandlers, options: XmlReadOptions = {}): number {
  const { bytes, encoding, arriving } =
    typeof xml === 'string' ? { bytes: documentBytes(xml), encoding: 'utf8' as const, arriving: undefined } : xml;
  const bytesIn = new ArrivedBytes(bytes, arriving, options.arrivalLookahead);
  const parser = new SaxesParser();
  let depth = 0;
  let pending = '';
  /** A tag ended (saxes's `position`, in the text given to it) in the stretch being written, and where. */
  let tagInStretch = false;
  let tagEnd = 0;
  /** Only whitespace since the last tag read (by saxes or the scanner); false before the first tag. */
  let blankSinceTag = false;

  const flushText = (): void => {
    if (pending === '') return;
    const value = pending.trim();
    pending = '';
    if (value !== '') handlers.text(value);
  };
  const sink: ScannedElementSink = {
    open(name, attributes) {
      flushText();
      if (++depth > MAX_DEPTH) throw new XmlReadError('elements nested too deeply');
      handlers.open(name, attributes);
    },
    text(value) {
      pending = pending === '' ? value : pending + value;
    },
    close(name) {
      flushText();
      depth--;
      handlers.close(name);
    },
  };

  parser.on('error', (error) => {
    const hint = error.message.endsWith('undefined entity.') ? ' Only the five predefined XML entities are accepted.' : '';
    throw new XmlReadError(error.message + hint);
  });
  parser.on('doctype', (doctype) => {
    if (/<!ENTITY/i.test(doctype)) throw new XmlReadError('entity declarations are not read');
  });
  parser.on('text', sink.text);
  parser.on('cdata', sink.text);
  // saxes's position counts the characters it was given; inside a handler it is just past the '>'.
  parser.on('opentag', (tag: SaxesTagPlain) => {
    sink.open(localName(tag.name), localAttributes(tag.attributes));
    tagInStretch = true;
    tagEnd = parser.position;
  });
  parser.on('closetag', (tag: SaxesTagPlain) => {
    sink.close(localName(tag.name));
    tagInStretch = true;
    tagEnd = parser.position;
  });

  /** Characters given to saxes so far. */
  let written = 0;
  /** Decode bytes[from, to) (never inside a character: both ends are at ASCII bytes) and give it to saxes. */
  const { pointTags } = options;
  const write = (from: number, to: number): void => {
    pointTags?.countTo(to);
    if (from === to) return;
    const text = bytes.toString(encoding, from, to);
    const start = written;
    written += text.length;
    tagInStretch = false;
    parser.write(text);
    blankSinceTag = tagInStretch ? isBlankFrom(text, tagEnd - start) : blankSinceTag && isBlankFrom(text, 0);
  };

  if (options.repeatedElement === undefined) {
    write(0, bytesIn.whole());
    parser.close();
    return 0;
  }

  // saxes reads everything up to each occurrence of the marker. When it stopped in the content
  // of an element, right after a tag with only whitespace since (so not inside a comment, CDATA,
  // text or another tag), the scanner reads as many whole elements from there as it accepts;
  // saxes, left in the same state, continues after them.
  const marker = Buffer.from(`<${options.repeatedElement}`, 'latin1');
  const scanner = new ElementScanner();
  /** bytes[0, fed) has been read, by saxes or the scanner. */
  let fed = 0;
  let scanned = 0;
  for (let at = bytesIn.indexOf(marker, 0); at !== -1;) {
    write(fed, at);
    fed = at;
    let next = at + 1;
    if (depth > 0 && blankSinceTag) {
      // Only whitespace is pending here, which no event would carry.
      pending = '';
      const [end, count] = readRepeatedElements(
        bytes,
        at,
        marker,
        scanner,
        sink,
        MAX_DEPTH - depth,
        options.pointReader,
        pointTags,
        bytesIn,
      );
      scanned += count;
      if (end > at) {
        fed = end;
        blankSinceTag = true;
        next = end;
      }
    }
    at = bytesIn.indexOf(marker, next);
  }
  write(fed, bytesIn.whole());
  parser.close();
  return scanned;
}

/**
 * Read consecutive elements from `start`, whitespace between them: by the point reader's
 * templates, else scanned and replayed. Gives the index after the last one read (`start` when
 * none) and how many were read. Every element is complete, so the depth stays `depthLeft`.
 */
function readRepeatedElements(
  xml: Buffer,
  start: number,
  marker: Buffer,
  scanner: ElementScanner,
  sink: ScannedElementSink,
  depthLeft: number,
  pointReader: TemplatePointReader | undefined,
  pointTags: PointTagCounter | undefined,
  bytesIn: ArrivedBytes,
): [end: number, count: number] {
  let end = start;
  let at = start;
  let count = 0;
  for (;;) {
    bytesIn.ensure(at + bytesIn.lookahead);
    let after = pointReader ? pointReader.tryRead(xml, at, depthLeft) : -1;
    if (after < 0) {
      const names = scanner.namesKnown();
      after = scanner.scan(xml, at, depthLeft);
      if (after < 0 && !bytesIn.complete()) {
        // Refused before the document is whole: perhaps only cut short. Tried again with twice the bytes
        // past it (at last with the whole document, which decides), and the names that scan met are
        // forgotten, so the scanner is as it would have been.
        scanner.forgetNamesAfter(names);
        bytesIn.more(at);
        continue;
      }
      if (after < 0) return [end, count];
      if (!pointReader?.learn(xml, at, after, scanner.tokens())) {
        pointTags?.countTo(after);
        scanner.replay(xml, sink);
      } else if (pointReader.tryRead(xml, at, depthLeft) !== after) {
        // A template learnt from this very element matches it; anything else is a bug here.
        throw new Error('A learnt point template did not read the element it was learnt from.');
      }
    }
    count++;
    end = after;
    at = after;
    for (;;) {
      while (isBlankCode(xml[at] as number)) at++;
      // Bytes not arrived read as 0, which is no whitespace: wait for them (a no-op for a whole document).
      if (bytesIn.has(at + marker.length)) break;
      bytesIn.ensure(at + marker.length + bytesIn.lookahead);
    }
    if (!startsWithAt(xml, marker, at)) return [end, count];
  }
}

function isBlankCode(code: number): boolean {
  return code === 32 || code === 10 || code === 9 || code === 13;
}

function isBlankFrom(text: string, from: number): boolean {
  for (let i = from; i < text.length; i++) if (!isBlankCode(text.charCodeAt(i))) return false;
  return true;
}

function startsWithAt(xml: Buffer, marker: Buffer, at: number): boolean {
  for (let k = 0; k < marker.length; k++) if (xml[at + k] !== marker[k]) return false;
  return true;
}

/**
 * The bytes of a document read so far: all of them, or, while it arrives, those arrived. Every read of the
 * reader goes through here or stays inside what it checked has arrived; a whole document never waits.
 */
class ArrivedBytes {
  /** bytes[0, available) have arrived. */
  private available: number;

  constructor(
    private readonly bytes: Buffer,
    private readonly arriving: ArrivingXml | undefined,
    /** Bytes in hand past an element before it is read (tests make it small, to cut elements often). */
    readonly lookahead = ARRIVAL_LOOKAHEAD_BYTES,
  ) {
    this.available = arriving ? arriving.waitFor(0) : bytes.length;
  }

  /** Waits until twice as many bytes past `at` have arrived as now (or the whole document). */
  more(at: number): void {
    this.ensure(at + 2 * Math.max(this.available - at, this.lookahead));
  }

  complete(): boolean {
    return this.arriving === undefined || this.arriving.length >= 0;
  }

  /** True when bytes[0, end) have arrived, or the whole document has. */
  has(end: number): boolean {
    return end <= this.available || this.complete();
  }

  /** Waits until bytes[0, end) have arrived or the whole document has. */
  ensure(end: number): void {
    if (end > this.available && this.arriving !== undefined && this.arriving.length < 0) {
      this.available = this.arriving.waitFor(end);
    }
  }

  /** Waits for the whole document; gives its length. */
  whole(): number {
    if (this.arriving === undefined) return this.bytes.length;
    while (this.arriving.length < 0) this.available = this.arriving.waitFor(Number.MAX_SAFE_INTEGER);
    return this.arriving.length;
  }

  /** `bytes.indexOf(marker, from)` in the document, waiting for more bytes until it is found or all have arrived. */
  indexOf(marker: Buffer, from: number): number {
    if (this.arriving === undefined) return this.bytes.indexOf(marker, from);
    for (let start = from; ;) {
      const found = this.bytes.subarray(0, this.available).indexOf(marker, start);
      if (found !== -1 || this.arriving.length >= 0) return found;
      // A marker may straddle what has arrived and what has not.
      start = Math.max(start, this.available - marker.length + 1);
      this.available = this.arriving.waitFor(this.available + 1);
    }
  }
}
