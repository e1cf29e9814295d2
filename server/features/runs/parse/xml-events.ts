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

/**
 * Read a whole XML document as events, in document order, while checking that it is
 * well-formed. Throws `XmlReadError` when it is not (mismatched or unclosed tags, a truncated
 * document, an undefined entity, an entity declaration, nesting deeper than 64 elements).
 * Errors thrown by the handlers pass through unchanged.
 */
export function readXmlEvents(xml: string, handlers: XmlEventHandlers): void {
  const parser = new SaxesParser();
  let depth = 0;
  let pending = '';

  const flushText = (): void => {
    if (pending === '') return;
    const value = pending.trim();
    pending = '';
    if (value !== '') handlers.text(value);
  };

  parser.on('error', (error) => {
    const hint = error.message.endsWith('undefined entity.') ? ' Only the five predefined XML entities are accepted.' : '';
    throw new XmlReadError(error.message + hint);
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
