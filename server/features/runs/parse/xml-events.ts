/**
 * The one place that tokenises XML for the track importer. Readers receive open/text/close
 * events with namespace prefixes removed, so this module can be swapped for a streaming parser
 * (saxes, htmlparser2) without touching them.
 *
 * Today it is fast-xml-parser 5 (already a dependency) with entity processing off: DOCTYPE
 * entities are never expanded and external entities never resolved. Documents that declare
 * entities are refused before they get here (see detect.ts).
 */
import { XMLParser, XMLValidator } from 'fast-xml-parser';

export interface XmlEventHandlers {
  /** An element starts; `name` has no namespace prefix; attribute names are unprefixed too. */
  open(name: string, attrs: Readonly<Record<string, string>>): void;
  /** Text content of the innermost open element, trimmed, entities left as written. */
  text(value: string): void;
  close(name: string): void;
}

/** Nesting deeper than this is not a GPS file; refusing it keeps the walk bounded. */
const MAX_DEPTH = 64;

const parser = new XMLParser({
  preserveOrder: true,
  removeNSPrefix: true,
  ignoreAttributes: false,
  attributeNamePrefix: '',
  parseTagValue: false,
  parseAttributeValue: false,
  processEntities: false,
  htmlEntities: false,
  trimValues: true,
  ignoreDeclaration: true,
  ignorePiTags: true,
});

type OrderedNode = Record<string, unknown>;
const NO_ATTRS: Readonly<Record<string, string>> = Object.freeze({});

export class XmlReadError extends Error {}

/**
 * Parse a whole XML document and replay it as events, in document order. The document is first
 * checked for well-formedness (fast-xml-parser's parser alone is lenient about mismatched tags).
 * Throws `XmlReadError` when it is not well-formed.
 */
export function readXmlEvents(xml: string, handlers: XmlEventHandlers): void {
  const valid = XMLValidator.validate(xml);
  if (valid !== true) throw new XmlReadError(`${valid.err.msg} (line ${valid.err.line})`);
  let tree: unknown;
  try {
    tree = parser.parse(xml);
  } catch (error) {
    throw new XmlReadError(error instanceof Error ? error.message : String(error));
  }
  walk(tree as OrderedNode[], handlers, 0);
}

function walk(nodes: OrderedNode[], handlers: XmlEventHandlers, depth: number): void {
  if (depth > MAX_DEPTH) throw new XmlReadError('elements nested too deeply');
  for (const node of nodes) {
    for (const key in node) {
      if (key === ':@') continue;
      const value = node[key];
      if (key === '#text') {
        handlers.text(String(value));
        continue;
      }
      const attrs = (node[':@'] as Record<string, string> | undefined) ?? NO_ATTRS;
      handlers.open(key, attrs);
      if (Array.isArray(value)) walk(value as OrderedNode[], handlers, depth + 1);
      handlers.close(key);
    }
  }
}
