/**
 * Track points read straight from the document's bytes into `PointColumns`, for files whose
 * points all look alike (nearly every device export: the same tags, attributes and whitespace
 * around different numbers and times).
 *
 * The first point the element scanner accepts (element-scanner.ts) becomes a template: the
 * point's bytes with a hole ("slot") for every attribute value and every text. A later point is
 * read by the template when its bytes equal the template's between the slots and every slot
 * holds only bytes the scanner treats alike there (for a text: printable ASCII without spaces,
 * `<`, `&` or `]`, at least one; for an attribute value: printable ASCII without `<`, `&` or its
 * quote). The scanner would then accept that point too, with the same tokens and these values,
 * so the reader's rules decide the same way: the format's reader (gpx-reader.ts, tcx-reader.ts)
 * turns each slot into a point field once per template (`plan`), and each point costs a
 * comparison of its bytes and a number or time read from each slot that feeds a field.
 * No strings, no events, no saxes.
 *
 * Anything else (a point shaped differently, a value with a space, an entity, a comment, CDATA,
 * non-ASCII bytes) is not matched and goes the existing way (scanner and events, or saxes), which
 * may teach a new template. `readXmlEvents` only offers a point where the scanner would be tried.
 */
import { POINT_FIELDS, type PointColumns } from '../../../../shared/tracks/point-columns.ts';
import { ATTRIBUTE, CLOSE, isAttributeValueByte, isTextByte, OPEN, TEXT, type ScannedTokens } from './element-scanner.ts';
import { parseIsoTime, parseNumber, readCommonIsoTime, readPlainDecimal } from './parse-time.ts';
import type { PointTagCounter } from './point-tags.ts';

/** How a reader reads a file. */
export interface ReadOptions {
  /** False sends every point through the events (tests compare the two ways: same result). */
  fastPoints?: boolean;
  /** How many points the file may hold: room made at once (else an estimate from its size). */
  expectedPoints?: number;
  /** Counts the document's point tags while it is read, refusing a file over the limit (point-tags.ts). */
  pointTags?: PointTagCounter;
  /** Tests: bytes in hand past a point before it is read while the file arrives (xml-events.ts). */
  arrivalLookahead?: number;
}

/** One hole of a template, as the format's reader sees it. */
export interface TemplateSlot {
  kind: 'attribute' | 'text';
  /** Local names from the point element (index 0) to the element holding the value. */
  path: readonly string[];
  /** An attribute's name without prefix (null for a namespace declaration); null for a text. */
  attribute: string | null;
}

/** The numeric fields of a point as indices into POINT_FIELDS. */
export type PointFieldIndex = number;

/** What the reader makes of a template: the field each slot sets, in document order. */
export interface PointPlan {
  /** Per slot, the index in POINT_FIELDS it sets (a later slot setting the same field wins), or −1. */
  fields: readonly PointFieldIndex[];
  /** The reader's `position_given` for such a point. */
  positionGiven: boolean;
}

/** A template as the format's reader sees it. */
export interface TemplateShape {
  /** Local names of every element of the point, in document order (the point itself first). */
  elements: readonly string[];
  slots: readonly TemplateSlot[];
}

/** What a format's reader provides: its rules for a point's values, and where the next point goes. */
export interface PointReaderRules {
  /**
   * The plan for points of this shape, or null when such a point does more than set fields
   * (opens something the reader counts, for example) and must go through the events.
   */
  plan(shape: TemplateShape): PointPlan | null;
  /** The columns a point read now would be added to, or null when the reader's state needs the events. */
  target(): PointColumns | null;
  /** The document's tag counter, if it has one (point-tags.ts), and the bytes of the point's name it counts. */
  counter?: PointTagCounter;
  tag?: Buffer;
}

/** A template longer than this (bytes) or with more slots is not kept: not a track point. */
const MAX_TEMPLATE_BYTES = 4096;
const MAX_SLOTS = 64;
/** Templates kept at once (files that alternate a few shapes, such as points with and without heart rate). */
const MAX_TEMPLATES = 4;
/** After this many points that could not become a template, stop trying (the file is not plain). */
const MAX_REFUSED = 64;
/** Nor learn more than this many templates in one file: a file of ever-changing shapes keeps the events. */
const MAX_LEARNT = 256;

const SLOT_TEXT = 0;
const SLOT_ATTRIBUTE = 1;
const TIME_FIELD = POINT_FIELDS.indexOf('t');

class PointTemplate {
  /** Literal s as whole 4-byte words (little-endian) in words[wordStarts[s], wordStarts[s + 1]), then its last 0–3 bytes. */
  private readonly words: Int32Array;
  private readonly wordStarts: Int32Array;
  private readonly tailStarts: Int32Array;

  constructor(
    /** The bytes between slots, one after another. */
    private readonly literals: Uint8Array,
    /** Where literal s ends in `literals` (slot s follows it); one more entry than slots. */
    private readonly literalEnds: Int32Array,
    /** Per slot: SLOT_TEXT, or SLOT_ATTRIBUTE with its quote in `quotes`. */
    private readonly slotKinds: Uint8Array,
    private readonly quotes: Uint8Array,
    /** Element levels, the point included: the scanner's depth check. */
    readonly levels: number,
    /** Per field (POINT_FIELDS order), the slot that sets it, or −1. */
    readonly fieldSlots: Int32Array,
    readonly positionGiven: boolean,
    /**
     * True when the literal bytes hold the point's own opening tag and no other that the tag
     * counter could count (point-tags.ts): such a point counts as one tag plus any in its values.
     */
    readonly ownTagOnly: boolean,
    /** Slots that set no field, whose values the counter must still look at. */
    readonly unusedSlots: Int32Array,
  ) {
    // Comparing four bytes at a time is about four times quicker than byte by byte.
    const view = new DataView(literals.buffer, literals.byteOffset, literals.byteLength);
    const words: number[] = [];
    this.wordStarts = new Int32Array(literalEnds.length + 1);
    this.tailStarts = new Int32Array(literalEnds.length);
    let from = 0;
    literalEnds.forEach((end, s) => {
      this.wordStarts[s] = words.length;
      for (; from + 4 <= end; from += 4) words.push(view.getInt32(from, true));
      this.tailStarts[s] = from;
      from = end;
    });
    this.wordStarts[literalEnds.length] = words.length;
    this.words = Int32Array.from(words);
  }

  /**
   * Match the point at xml[at] (`view` is a DataView of the same bytes): the index after it, or
   * −1. Slot s is then xml[starts[s], ends[s]).
   */
  match(xml: Uint8Array, view: DataView, at: number, starts: Int32Array, ends: Int32Array): number {
    const { literals, literalEnds, slotKinds, quotes, words, wordStarts, tailStarts } = this;
    const slots = slotKinds.length;
    const length = xml.length;
    let pos = at;
    for (let s = 0; ; s++) {
      const literalEnd = literalEnds[s] as number;
      const tail = tailStarts[s] as number;
      const wordEnd = wordStarts[s + 1] as number;
      // The whole literal must fit before the end: DataView refuses reads past it.
      if (pos + literalEnd - (s === 0 ? 0 : (literalEnds[s - 1] as number)) > length) return -1;
      for (let w = wordStarts[s] as number; w < wordEnd; w++, pos += 4) {
        if (view.getInt32(pos, true) !== words[w]) return -1;
      }
      for (let l = tail; l < literalEnd; l++, pos++) {
        if (xml[pos] !== literals[l]) return -1;
      }
      if (s === slots) return pos;
      starts[s] = pos;
      if (slotKinds[s] === SLOT_TEXT) {
        // Past the end xml[pos] is undefined, which is no text byte.
        while (isTextByte(xml[pos] as number)) pos++;
        if (pos === starts[s]) return -1;
      } else {
        const quote = quotes[s] as number;
        // Stops at the quote, which the next literal then matches.
        while (isAttributeValueByte(xml[pos] as number, quote)) pos++;
      }
      ends[s] = pos;
    }
  }
}

/**
 * The template of the element the scanner just accepted at xml[start, end), planned by `rules`,
 * or null when it cannot be one.
 */
function learnTemplate(
  xml: Buffer,
  start: number,
  end: number,
  tokens: ScannedTokens,
  rules: PointReaderRules,
): PointTemplate | null {
  if (end - start > MAX_TEMPLATE_BYTES) return null;
  const slots: TemplateSlot[] = [];
  const kinds: number[] = [];
  const quotes: number[] = [];
  const literalEnds: number[] = [];
  const literals = new Uint8Array(end - start);
  let literalLength = 0;
  let copied = start;
  const path: string[] = [];
  const elements: string[] = [];
  let levels = 0;
  const { count, kinds: tokenKinds, nameIds, starts, ends } = tokens;
  for (let k = 0; k < count; k++) {
    const kind = tokenKinds[k];
    if (kind === OPEN) {
      const name = tokens.localName(nameIds[k] as number);
      path.push(name);
      elements.push(name);
      levels = Math.max(levels, path.length);
      continue;
    }
    if (kind === CLOSE) {
      path.pop();
      continue;
    }
    const from = starts[k] as number;
    const to = ends[k] as number;
    if (kind === TEXT) {
      // A text with whitespace inside would need its own rules here; such points keep the events.
      for (let i = from; i < to; i++) if (!isTextByte(xml[i] as number)) return null;
      slots.push({ kind: 'text', path: path.slice(), attribute: null });
      kinds.push(SLOT_TEXT);
      quotes.push(0);
    } else if (kind === ATTRIBUTE) {
      slots.push({ kind: 'attribute', path: path.slice(), attribute: tokens.attributeName(nameIds[k] as number) });
      kinds.push(SLOT_ATTRIBUTE);
      quotes.push(xml[to] as number);
    }
    literals.set(xml.subarray(copied, from), literalLength);
    literalLength += from - copied;
    literalEnds.push(literalLength);
    copied = to;
  }
  if (slots.length > MAX_SLOTS) return null;
  literals.set(xml.subarray(copied, end), literalLength);
  literalLength += end - copied;
  literalEnds.push(literalLength);

  const plan = rules.plan({ elements, slots });
  if (plan === null) return null;
  const fieldSlots = new Int32Array(POINT_FIELDS.length).fill(-1);
  plan.fields.forEach((field, slot) => {
    if (field >= 0) fieldSlots[field] = slot;
  });
  const unusedSlots = slots.map((_, slot) => slot).filter((slot) => !fieldSlots.includes(slot));
  const kept = literals.slice(0, literalLength);
  return new PointTemplate(
    kept,
    Int32Array.from(literalEnds),
    Uint8Array.from(kinds),
    Uint8Array.from(quotes),
    levels,
    fieldSlots,
    plan.positionGiven,
    rules.tag === undefined ? false : holdsOwnTagOnly(kept, literalEnds, rules.tag),
    Int32Array.from(unusedSlots),
  );
}

const LESS_THAN = 0x3c;
const COLON = 0x3a;
/** Bytes that may follow a point's name in its opening tag: whitespace, `>` or `/` (as point-tags.ts). */
function endsName(code: number | undefined): boolean {
  return code === 0x20 || code === 0x3e || code === 0x09 || code === 0x0a || code === 0x0d || code === 0x2f;
}

/**
 * Whether the literals (literal s is literals[literalEnds[s − 1], literalEnds[s])) hold the point's
 * opening tag `<tag` at their start and every other occurrence of `tag` in them is one the counter
 * never counts whatever the values around it: a byte before it inside the literal that is neither
 * `<` nor `:`, or a byte after it inside the literal that cannot end a name (`</trkpt>`, `TrackPointExtension`).
 */
function holdsOwnTagOnly(literals: Uint8Array, literalEnds: readonly number[], tag: Buffer): boolean {
  const bytes = Buffer.from(literals.buffer, literals.byteOffset, literals.byteLength);
  if (bytes[0] !== LESS_THAN || !bytes.subarray(1, 1 + tag.length).equals(tag) || !endsName(bytes[1 + tag.length])) return false;
  let from = 0;
  for (const end of literalEnds) {
    for (let at = bytes.indexOf(tag, from); at !== -1 && at + tag.length <= end; at = bytes.indexOf(tag, at + 1)) {
      if (at === 1) continue;
      const before = at > from ? bytes[at - 1] : undefined;
      const after = at + tag.length < end ? bytes[at + tag.length] : undefined;
      const neverCounted =
        (before !== undefined && before !== LESS_THAN && before !== COLON) || (after !== undefined && !endsName(after));
      if (!neverCounted) return false;
    }
    from = end;
  }
  return true;
}

/** Reads track points by their templates; see the top of this file. */
export class TemplatePointReader {
  private templates: PointTemplate[] = [];
  private refused = 0;
  private learnt = 0;
  private starts = new Int32Array(MAX_SLOTS);
  private ends = new Int32Array(MAX_SLOTS);
  /** The document last read, as a Buffer (for the rare value read from a string), plain bytes and a DataView. */
  private xml: Buffer = Buffer.alloc(0);
  private codes: Uint8Array = new Uint8Array(0);
  private view: DataView<ArrayBufferLike> = new DataView(new ArrayBuffer(0));
  /** Points read by a template. */
  read = 0;
  /** The tag counter of the point being added, when it counts the values not read as plain numbers. */
  private counting: PointTagCounter | undefined = undefined;

  constructor(private readonly rules: PointReaderRules) {}

  /**
   * Read the point at xml[at] into the reader's columns when the reader's state allows it and a
   * template matches within `depthLeft` levels: the index after the point, else −1 (nothing done).
   */
  tryRead(xml: Buffer, at: number, depthLeft: number): number {
    if (this.templates.length === 0) return -1;
    const columns = this.rules.target();
    if (columns === null) return -1;
    if (this.xml !== xml) {
      // One kind of array everywhere keeps the byte reads below monomorphic.
      this.xml = xml;
      this.codes = new Uint8Array(xml.buffer, xml.byteOffset, xml.byteLength);
      this.view = new DataView(xml.buffer, xml.byteOffset, xml.byteLength);
    }
    for (const template of this.templates) {
      if (template.levels > depthLeft) continue;
      const end = template.match(this.codes, this.view, at, this.starts, this.ends);
      if (end >= 0) {
        // Counted before the point is kept, so a file over the limit is refused first. A point whose
        // tags are not this simple is left to the counter's next stretch, bytes and all.
        const counter = template.ownTagOnly ? this.rules.counter : undefined;
        this.counting = counter;
        counter?.pointAt(at, end);
        this.add(template, columns);
        if (counter) {
          const unused = template.unusedSlots;
          for (let k = 0; k < unused.length; k++) {
            const slot = unused[k] as number;
            counter.countIn(this.starts[slot] as number, this.ends[slot] as number);
          }
        }
        this.read++;
        return end;
      }
    }
    return -1;
  }

  /**
   * The scanner accepted the point at xml[start, end) with `tokens`, and the reader's state allows
   * reading it here: learn its shape. True when a template now matches it.
   */
  learn(xml: Buffer, start: number, end: number, tokens: ScannedTokens): boolean {
    if (this.refused >= MAX_REFUSED || this.learnt >= MAX_LEARNT || this.rules.target() === null) return false;
    const template = learnTemplate(xml, start, end, tokens, this.rules);
    if (template === null) {
      this.refused++;
      return false;
    }
    this.learnt++;
    this.templates = [template, ...this.templates.slice(0, MAX_TEMPLATES - 1)];
    return true;
  }

  private add(template: PointTemplate, columns: PointColumns): void {
    const i = columns.add();
    const { fieldSlots, positionGiven } = template;
    // POINT_FIELDS order: t, lat, lon, ele, hr, cad, temp, distance_m.
    this.time(fieldSlots[0] as number, columns.t, i);
    this.number(fieldSlots[1] as number, columns.lat, i);
    this.number(fieldSlots[2] as number, columns.lon, i);
    this.number(fieldSlots[3] as number, columns.ele, i);
    this.number(fieldSlots[4] as number, columns.hr, i);
    this.number(fieldSlots[5] as number, columns.cad, i);
    this.number(fieldSlots[6] as number, columns.temp, i);
    this.number(fieldSlots[7] as number, columns.distance_m, i);
    columns.position_given[i] = positionGiven ? 1 : 0;
  }

  /** column[i] = parseNumber(slot's text), reading the plain form from the bytes; NaN without a slot. */
  private number(slot: number, column: Float64Array, i: number): void {
    if (slot < 0) {
      column[i] = Number.NaN;
      return;
    }
    const start = this.starts[slot] as number;
    const end = this.ends[slot] as number;
    if (!readPlainDecimal(this.codes, start, end, column, i)) {
      column[i] = parseNumber(this.xml.toString('latin1', start, end));
      this.counting?.countIn(start, end);
    }
  }

  /** column[i] = parseIsoTime(slot's text), reading the common form from the bytes; NaN without a slot. */
  private time(slot: number, column: Float64Array, i: number): void {
    if (slot < 0) {
      column[i] = Number.NaN;
      return;
    }
    const start = this.starts[slot] as number;
    const end = this.ends[slot] as number;
    if (!readCommonIsoTime(this.codes, start, end, column, i)) {
      column[i] = parseIsoTime(this.xml.toString('latin1', start, end));
      this.counting?.countIn(start, end);
    }
  }
}

/** Guard the hand-unrolled order in `add` against a change of POINT_FIELDS. */
if (TIME_FIELD !== 0 || POINT_FIELDS.join() !== 't,lat,lon,ele,hr,cad,temp,distance_m') {
  throw new Error('point-template.ts: POINT_FIELDS changed; update TemplatePointReader.add');
}
