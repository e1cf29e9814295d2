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
 */
import { SaxesParser, type SaxesTagPlain } from 'saxes';
import { ElementScanner, type ScannedElementSink } from './element-scanner.ts';

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
}

/**
 * Read a whole XML document as events, in document order, while checking that it is
 * well-formed. Throws `XmlReadError` when it is not (mismatched or unclosed tags, a truncated
 * document, an undefined entity, an entity declaration, nesting deeper than 64 elements).
 * Errors thrown by the handlers pass through unchanged. Returns how many repeated elements the
 * scanner read (the rest of the document went through saxes).
 */
export function readXmlEvents(xml: string, handlers: XmlEventHandlers, options: XmlReadOptions = {}): number {
  const parser = new SaxesParser();
  let depth = 0;
  let pending = '';
  /** Characters read by the scanner instead of saxes, so far. */
  let skipped = 0;
  /** Index in xml just after the last tag read (by saxes or the scanner), or −1. */
  let lastTagEnd = -1;

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
    lastTagEnd = parser.position + skipped;
  });
  parser.on('closetag', (tag: SaxesTagPlain) => {
    sink.close(localName(tag.name));
    lastTagEnd = parser.position + skipped;
  });

  if (options.repeatedElement === undefined) {
    parser.write(xml).close();
    return 0;
  }

  // saxes reads everything up to each occurrence of the marker. When it stopped in the content
  // of an element, right after a tag with only whitespace since (so not inside a comment, CDATA,
  // text or another tag), the scanner reads as many whole elements from there as it accepts;
  // saxes, left in the same state, continues after them.
  const marker = `<${options.repeatedElement}`;
  const scanner = new ElementScanner();
  /** xml[0, fed) has been read, by saxes or the scanner. */
  let fed = 0;
  let scanned = 0;
  for (let at = xml.indexOf(marker); at !== -1;) {
    parser.write(xml.slice(fed, at));
    fed = at;
    let next = at + 1;
    if (depth > 0 && lastTagEnd >= 0 && isBlankBetween(xml, lastTagEnd, at)) {
      const [end, count] = readRepeatedElements(xml, at, marker, scanner, sink, () => MAX_DEPTH - depth);
      scanned += count;
      if (end > at) {
        skipped += end - at;
        fed = end;
        lastTagEnd = end;
        next = end;
      }
    }
    at = xml.indexOf(marker, next);
  }
  parser.write(xml.slice(fed)).close();
  return scanned;
}

/**
 * Scan and replay consecutive elements from `start`, whitespace between them. Gives the index
 * after the last one read (`start` when none) and how many were read.
 */
function readRepeatedElements(
  xml: string,
  start: number,
  marker: string,
  scanner: ElementScanner,
  sink: ScannedElementSink,
  depthLeft: () => number,
): [end: number, count: number] {
  let end = start;
  let at = start;
  let count = 0;
  for (;;) {
    const after = scanner.scan(xml, at, depthLeft());
    if (after < 0) return [end, count];
    scanner.replay(xml, sink);
    count++;
    end = after;
    at = after;
    while (isBlankCode(xml.charCodeAt(at))) at++;
    if (!xml.startsWith(marker, at)) return [end, count];
  }
}

function isBlankCode(code: number): boolean {
  return code === 32 || code === 10 || code === 9 || code === 13;
}

function isBlankBetween(xml: string, from: number, to: number): boolean {
  for (let i = from; i < to; i++) if (!isBlankCode(xml.charCodeAt(i))) return false;
  return true;
}
