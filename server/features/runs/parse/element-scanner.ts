/**
 * A strict reader for one XML element written in the plainest form, used by xml-events.ts for
 * the track points that make up nearly all of a GPS file (a 100-mile 1 s GPX has 108 000 of
 * them, and saxes spends most of the import on their tags).
 *
 * It accepts only a subset of well-formed XML and gives up (returns −1) at anything else, so
 * whatever it accepts is well-formed and whatever it gives up on is left to saxes, which then
 * reports the error or reads the element itself:
 * - names of ASCII letters, digits, `_ : . -` (not starting with a digit, `.` or `-`);
 * - attributes separated by whitespace, each name once, values of printable ASCII without
 *   `<`, `&` or tabs and line breaks (so no entity and no value normalisation is involved);
 * - text of printable ASCII, tabs and line breaks, without `&` or `]` (no entity and no `]]>`),
 *   with carriage returns only at the ends of a text (where trimming removes them);
 * - no comments, CDATA sections, processing instructions or non-ASCII characters at all;
 * - every end tag naming the open element; at most `maxDepth` levels.
 * The element is first checked to its end and only then replayed as events, so a reader never
 * sees part of an element that turns out to be broken.
 *
 * It reads the document's bytes, never a decoded string: everything it accepts is ASCII, which is
 * the same byte in UTF-8, Latin-1 and Windows-1252, so an import never decodes its points' bytes
 * as a whole (xml-events.ts decodes only what saxes reads). A string given instead is read as its
 * UTF-8 bytes, and positions are then byte positions.
 */

const LESS = 60;
const GREATER = 62;
const SLASH = 47;
const EQUALS = 61;
const DOUBLE_QUOTE = 34;
const SINGLE_QUOTE = 39;
const AMPERSAND = 38;
const CLOSE_BRACKET = 93;
const SPACE = 32;
const TAB = 9;
const LINE_FEED = 10;
const CARRIAGE_RETURN = 13;

/** Kinds of the tokens a scan leaves (see `ScannedTokens`). */
export const OPEN = 0;
export const ATTRIBUTE = 1;
export const TEXT = 2;
export const CLOSE = 3;

/** Distinct names one document may use inside the scanned elements; past this, saxes reads the rest. */
const MAX_NAMES = 256;

/** Where the scanned element goes: the same calls saxes's events lead to in xml-events.ts. */
export interface ScannedElementSink {
  /**
   * `name` and the attribute names have their prefixes removed and namespace declarations are
   * left out, as xml-events.ts does with saxes's tags.
   */
  open(name: string, attributes: Readonly<Record<string, string>>): void;
  /** Text already trimmed and never empty. */
  text(value: string): void;
  close(name: string): void;
}

const NO_ATTRIBUTES: Readonly<Record<string, string>> = Object.freeze({});

/**
 * The tokens of the element a scan last accepted, in document order, for readers that learn its
 * shape (point-template.ts). Token k is `kinds[k]` with a name id (`names`), and for an attribute
 * value or a text the byte range [starts[k], ends[k]) of its characters (a text already trimmed).
 */
export interface ScannedTokens {
  readonly count: number;
  readonly kinds: Uint8Array;
  readonly nameIds: Int32Array;
  readonly starts: Int32Array;
  readonly ends: Int32Array;
  /** The name without its namespace prefix. */
  localName(id: number): string;
  /** As an attribute: its name without prefix, or null for a namespace declaration (which readers never see). */
  attributeName(id: number): string | null;
}

/** Character classes of ASCII codes; anything else (and NaN past the end) is in none. */
const NAME_START = 1;
const NAME_CHAR = 2;
const BLANK = 4;
/** Printable, not a space, and safe in text here: not `<`, `&` or `]`. */
const TEXT_CHAR = 8;
const CHAR_CLASS = new Uint8Array(128);
for (let code = 0; code < 128; code++) {
  const letter = (code >= 97 && code <= 122) || (code >= 65 && code <= 90);
  let cls = 0;
  if (letter || code === 95 || code === 58) cls |= NAME_START | NAME_CHAR;
  if ((code >= 48 && code <= 57) || code === 45 || code === 46) cls |= NAME_CHAR;
  if (code === SPACE || code === LINE_FEED || code === TAB || code === CARRIAGE_RETURN) cls |= BLANK;
  if (code > SPACE && code <= 126 && code !== LESS && code !== AMPERSAND && code !== CLOSE_BRACKET) cls |= TEXT_CHAR;
  CHAR_CLASS[code] = cls;
}

/** The document as bytes; a string as its UTF-8 bytes (the last one converted is kept, for scan then replay). */
let lastString: string | null = null;
let lastStringBytes: Buffer = Buffer.alloc(0);
export function documentBytes(xml: string | Buffer): Buffer {
  if (typeof xml !== 'string') return xml;
  if (xml !== lastString) {
    lastString = xml;
    lastStringBytes = Buffer.from(xml, 'utf8');
  }
  return lastStringBytes;
}

/** Past the end a typed array gives undefined, which (like NaN before) is in no class and equals no code. */
function classOf(code: number): number {
  return code < 128 ? (CHAR_CLASS[code] as number) : 0;
}

function isBlank(code: number): boolean {
  return (classOf(code) & BLANK) !== 0;
}

/** A byte the scanner takes as part of a text (never whitespace, `<`, `&` or `]`); false past the end. */
export function isTextByte(code: number): boolean {
  return (classOf(code) & TEXT_CHAR) !== 0;
}

/** A byte the scanner takes inside an attribute value quoted by `quote` (the quote itself ends it). */
export function isAttributeValueByte(code: number, quote: number): boolean {
  return code >= SPACE && code <= 126 && code !== LESS && code !== AMPERSAND && code !== quote;
}

/** True when xml[start, start + name.length) is `name` (an ASCII name). */
function sameChars(xml: Buffer, start: number, name: string): boolean {
  for (let k = 0; k < name.length; k++) if (xml[start + k] !== name.charCodeAt(k)) return false;
  return true;
}

/** Slots of the open-addressing table of names: four times MAX_NAMES keeps probes short. */
const NAME_SLOTS = 1024;

/** Element and attribute names seen so far, each sliced out of the document once. */
class NameTable {
  readonly qualified: string[] = [];
  /** The name without its namespace prefix. */
  readonly local: string[] = [];
  /** As an attribute: its name without prefix, or null for a namespace declaration (dropped). */
  readonly attributeName: (string | null)[] = [];
  private readonly slots = new Int32Array(NAME_SLOTS).fill(-1);
  /** The slot of each id, to forget names again (`forgetAfter`). */
  private readonly slotOf: number[] = [];

  /** The id of the name at xml[start, end) whose characters hash to `hash`, or −1 when the table is full. */
  idOf(xml: Buffer, start: number, end: number, hash: number): number {
    let slot = hash & (NAME_SLOTS - 1);
    for (let id = this.slots[slot] as number; id !== -1; id = this.slots[slot] as number) {
      const name = this.qualified[id] as string;
      if (name.length === end - start && sameChars(xml, start, name)) return id;
      slot = (slot + 1) & (NAME_SLOTS - 1);
    }
    if (this.qualified.length >= MAX_NAMES) return -1;
    const name = xml.toString('latin1', start, end);
    const id = this.qualified.length;
    this.slots[slot] = id;
    this.slotOf.push(slot);
    this.qualified.push(name);
    const colon = name.indexOf(':');
    const local = colon === -1 ? name : name.slice(colon + 1);
    this.local.push(local);
    this.attributeName.push(name === 'xmlns' || name.startsWith('xmlns:') ? null : local);
    return id;
  }

  /**
   * Forget every name after the first `count`, newest first (so each freed slot ends a probe chain as
   * it did before that name came): the table is as it was when it held `count` names.
   */
  forgetAfter(count: number): void {
    while (this.qualified.length > count) {
      this.slots[this.slotOf.pop() as number] = -1;
      this.qualified.pop();
      this.local.pop();
      this.attributeName.pop();
    }
  }
}

export class ElementScanner {
  private readonly names = new NameTable();
  /** Tokens of the last scanned element: kind, then up to three numbers (name id, text start, text end). */
  private kinds = new Uint8Array(64);
  private first = new Int32Array(64);
  private second = new Int32Array(64);
  private third = new Int32Array(64);
  private count = 0;
  /** Name ids of the open elements while scanning. */
  private readonly open: number[] = [];

  /**
   * Check the element that starts at `xml[start]` (a `<`) and remember its tokens. Returns the
   * index just after its end tag, or −1 when it is not in the accepted subset (or not complete).
   */
  scan(source: string | Buffer, start: number, maxDepth: number): number {
    const xml = documentBytes(source);
    const names = this.names;
    this.count = 0;
    let depth = 0;
    let pos = start;
    for (;;) {
      // pos is at a '<'.
      let code = at(xml, pos + 1);
      if (code === SLASH) {
        if (depth === 0) return -1;
        const id = this.open[depth - 1] as number;
        const name = names.qualified[id] as string;
        if (!sameChars(xml, pos + 2, name)) return -1;
        pos += 2 + name.length;
        code = at(xml, pos);
        while (isBlank(code)) code = at(xml, ++pos);
        if (code !== GREATER) return -1;
        pos++;
        this.push(CLOSE, id, 0, 0);
        if (--depth === 0) return pos;
      } else {
        if ((classOf(code) & NAME_START) === 0 || depth >= maxDepth) return -1;
        const nameStart = pos + 1;
        let hash = code;
        pos = nameStart + 1;
        for (code = at(xml, pos); (classOf(code) & NAME_CHAR) !== 0; code = at(xml, ++pos)) {
          hash = (Math.imul(hash, 31) + code) | 0;
        }
        const id = names.idOf(xml, nameStart, pos, hash);
        if (id < 0) return -1;
        this.push(OPEN, id, 0, 0);
        const firstAttribute = this.count;
        for (;;) {
          code = at(xml, pos);
          let spaced = false;
          while (isBlank(code)) {
            spaced = true;
            code = at(xml, ++pos);
          }
          if (code === GREATER) {
            this.open[depth++] = id;
            pos++;
            break;
          }
          if (code === SLASH) {
            if (at(xml, pos + 1) !== GREATER) return -1;
            pos += 2;
            this.push(CLOSE, id, 0, 0);
            if (depth === 0) return pos;
            break;
          }
          if (!spaced || (classOf(code) & NAME_START) === 0) return -1;
          const attributeStart = pos;
          let hash = code;
          for (code = at(xml, ++pos); (classOf(code) & NAME_CHAR) !== 0; code = at(xml, ++pos)) {
            hash = (Math.imul(hash, 31) + code) | 0;
          }
          const attributeId = names.idOf(xml, attributeStart, pos, hash);
          // "__proto__" would behave differently on a plain object than on saxes's prototype-free one.
          if (attributeId < 0 || names.attributeName[attributeId] === '__proto__') return -1;
          for (let k = firstAttribute; k < this.count; k++) if (this.first[k] === attributeId) return -1;
          code = at(xml, pos);
          while (isBlank(code)) code = at(xml, ++pos);
          if (code !== EQUALS) return -1;
          code = at(xml, ++pos);
          while (isBlank(code)) code = at(xml, ++pos);
          if (code !== DOUBLE_QUOTE && code !== SINGLE_QUOTE) return -1;
          const quote = code;
          const valueStart = ++pos;
          for (code = at(xml, pos); code !== quote; code = at(xml, ++pos)) {
            if (!isAttributeValueByte(code, quote)) return -1;
          }
          this.push(ATTRIBUTE, attributeId, valueStart, pos);
          pos++;
        }
      }
      // Text up to the next tag.
      let contentStart = -1;
      let contentEnd = -1;
      let returnAfterContent = false;
      for (code = at(xml, pos); code !== LESS; code = at(xml, ++pos)) {
        if (isTextByte(code)) {
          if (returnAfterContent) return -1;
          if (contentStart < 0) contentStart = pos;
          contentEnd = pos + 1;
        } else if (!isBlank(code)) {
          return -1; // `&`, `]`, control characters, non-ASCII, or the end of the document
        } else if (code === CARRIAGE_RETURN && contentStart >= 0) {
          // saxes turns a carriage return into a line feed; harmless only where trimming removes it.
          returnAfterContent = true;
        }
      }
      if (contentStart >= 0) this.push(TEXT, 0, contentStart, contentEnd);
    }
  }

  /** The tokens of the last element that `scan` accepted (valid until the next scan). */
  tokens(): ScannedTokens {
    const names = this.names;
    return {
      count: this.count,
      kinds: this.kinds,
      nameIds: this.first,
      starts: this.second,
      ends: this.third,
      localName: (id) => names.local[id] as string,
      attributeName: (id) => names.attributeName[id] ?? null,
    };
  }

  /** How many names the scanner knows (see `forgetNamesAfter`). */
  namesKnown(): number {
    return this.names.qualified.length;
  }

  /**
   * Forget the names learnt after the scanner knew `count`: a scan refused only because the document had
   * not all arrived (xml-events.ts) leaves the scanner as if it had never run.
   */
  forgetNamesAfter(count: number): void {
    this.names.forgetAfter(count);
  }

  /** Send the last element that `scan` accepted to `sink`, as saxes would have. */
  replay(source: string | Buffer, sink: ScannedElementSink): void {
    const xml = documentBytes(source);
    const { kinds, first, second, third, count, names } = this;
    for (let k = 0; k < count; k++) {
      const kind = kinds[k];
      if (kind === OPEN) {
        const id = first[k] as number;
        let attributes = NO_ATTRIBUTES;
        if (kinds[k + 1] === ATTRIBUTE && k + 1 < count) {
          // In document order, so of two names that lose their prefixes to the same name the last wins, as in xml-events.ts.
          const local: Record<string, string> = {};
          while (k + 1 < count && kinds[k + 1] === ATTRIBUTE) {
            k++;
            const name = names.attributeName[first[k] as number];
            if (name !== null && name !== undefined) local[name] = xml.toString('latin1', second[k], third[k]);
          }
          attributes = local;
        }
        sink.open(names.local[id] as string, attributes);
      } else if (kind === TEXT) {
        sink.text(xml.toString('latin1', second[k], third[k]));
      } else if (kind === CLOSE) {
        sink.close(names.local[first[k] as number] as string);
      }
    }
  }

  private push(kind: number, a: number, b: number, c: number): void {
    if (this.count === this.kinds.length) {
      const size = this.count * 2;
      this.kinds = grow(this.kinds, new Uint8Array(size));
      this.first = grow(this.first, new Int32Array(size));
      this.second = grow(this.second, new Int32Array(size));
      this.third = grow(this.third, new Int32Array(size));
    }
    const k = this.count++;
    this.kinds[k] = kind;
    this.first[k] = a;
    this.second[k] = b;
    this.third[k] = c;
  }
}

/** The byte at `index`, or undefined past the end (typed as a number: every test on it then fails). */
function at(xml: Buffer, index: number): number {
  return xml[index] as number;
}

function grow<T extends Uint8Array | Int32Array>(from: T, to: T): T {
  to.set(from);
  return to;
}
