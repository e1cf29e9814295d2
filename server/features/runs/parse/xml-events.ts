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
 */
import { SaxesParser, type SaxesTagPlain } from 'saxes';

export interface XmlEventHandlers {
  /** An element starts; `name` has no namespace prefix; attribute names are unprefixed too. */
  open(name: string, attrs: Readonly<Record<string, string>>): void;
  /**
   * Text content of the innermost open element up to its next child or its end, trimmed and
   * never empty (CDATA sections join the text, comments are dropped). Entity references are
   * left as written (`&amp;` stays `&amp;`); numeric character references are decoded.
   */
  text(value: string): void;
  close(name: string): void;
}

/** Nesting deeper than this is not a GPS file; refusing it keeps the walk bounded. */
const MAX_DEPTH = 64;

/**
 * saxes resolves entity names through this per-parser table (it starts with the five XML
 * predefined entities). Mapping each to its own reference keeps text as written, as readers
 * expect; any other name is reported by saxes as an undefined entity, which becomes an error.
 * `ENTITIES` is a public field of saxes 6 that its type declarations leave out.
 */
const LITERAL_ENTITIES: Readonly<Record<string, string>> = Object.freeze({
  amp: '&amp;',
  lt: '&lt;',
  gt: '&gt;',
  quot: '&quot;',
  apos: '&apos;',
});

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

/**
 * Read a whole XML document as events, in document order, while checking that it is
 * well-formed. Throws `XmlReadError` when it is not (mismatched or unclosed tags, a truncated
 * document, an undefined entity, an entity declaration, nesting deeper than 64 elements).
 * Errors thrown by the handlers pass through unchanged.
 */
export function readXmlEvents(xml: string, handlers: XmlEventHandlers): void {
  // Position tracking only enriches the error message, which never reaches the runner, and
  // costs about a tenth of the parse.
  const parser = new SaxesParser({ position: false });
  (parser as unknown as { ENTITIES: Record<string, string> }).ENTITIES = { ...LITERAL_ENTITIES };
  let depth = 0;
  let pending = '';

  const flushText = (): void => {
    if (pending === '') return;
    const value = pending.trim();
    pending = '';
    if (value !== '') handlers.text(value);
  };

  parser.on('error', (error) => {
    throw new XmlReadError(error.message);
  });
  parser.on('doctype', (doctype) => {
    if (/<!ENTITY/i.test(doctype)) throw new XmlReadError('entity declarations are not read');
  });
  parser.on('text', (text) => {
    pending = pending === '' ? text : pending + text;
  });
  parser.on('cdata', (text) => {
    pending = pending === '' ? text : pending + text;
  });
  parser.on('opentag', (tag: SaxesTagPlain) => {
    flushText();
    if (++depth > MAX_DEPTH) throw new XmlReadError('elements nested too deeply');
    handlers.open(localName(tag.name), localAttributes(tag.attributes));
  });
  parser.on('closetag', (tag: SaxesTagPlain) => {
    flushText();
    depth--;
    handlers.close(localName(tag.name));
  });

  parser.write(xml).close();
}
