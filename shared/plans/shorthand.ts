/**
 * The one-line shorthand for session plans, in the plain words runners write on paper:
 *
 *   2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-down
 *   10 mi easy, 8 mi @ 7:05/mi, 2 mi @ 6:55/mi, 1 mi cool-down
 *   45 min easy
 *
 * Grammar (EBNF; words are case-insensitive, spaces optional between a number and its unit):
 *
 *   plan      = item { "," item } ;
 *   item      = repeat | part ;
 *   repeat    = count ( "x" | "×" ) ( part | "(" part { "," part } ")" ) [ ( "w/" | "with" ) part ] ;
 *   part      = amount [ kind ] [ ( "@" | "at" ) target ] ;
 *   amount    = number distance-unit | number time-unit { number time-unit } ;   (* h, then min, then s *)
 *   kind      = "warm-up" | "wu" | "easy" | "steady" | "tempo" | "goal pace" | "rep"
 *             | "jog" | "recovery jog" | "recovery" | "cool-down" | "cd" | "strides" | … ;
 *   target    = pace | race-pace | heart-rate ;
 *   pace      = clock [ "-" clock ] [ "/" ( "mi" | "km" ) ] ;  (* no unit: the time for the part's own distance *)
 *   race-pace = ( "goal" | "MP" | "HMP" | "10K" | "5K" ) [ "pace" ] [ ( "+" | "-" ) integer "s" "/" ( "mi" | "km" ) ] ;
 *   heart-rate= integer [ "-" integer ] "bpm" ;
 *   clock     = [ hours ":" ] minutes ":" seconds ;
 *
 * Kinds left out are filled in: a part inside a repeat is a rep, the part after "w/" is a recovery jog;
 * elsewhere a part with no target is easy, one at goal or marathon pace is goal pace, and any other
 * target makes it steady.
 */
import { formatPace } from '../tracks/format.ts';
import { countExpandedParts } from './expand.ts';
import { PLAN_LIMITS } from './types.ts';
import type {
  DistanceUnit,
  Part,
  PartAmount,
  PartKind,
  PartTarget,
  PacePer,
  PlanItem,
  RelativePaceRef,
  Repeat,
} from './types.ts';
import { distanceFromWritten, distanceToWritten, paceFromWritten, paceToWritten } from './units.ts';

export interface ShorthandError {
  /** A sentence for the person writing the plan. */
  message: string;
  /** 0-based index into the text of the mistake (the text's length when something is missing at the end). */
  position: number;
  /** What would have been accepted there. */
  expected: string;
}

export type ShorthandResult = { ok: true; items: PlanItem[] } | { ok: false; error: ShorthandError };

// ---------------------------------------------------------------------------------------------
// Tokens

type TokenType = 'number' | 'clock' | 'word' | 'punct' | 'end';

interface Token {
  type: TokenType;
  /** As written. */
  text: string;
  /** Lower-cased word, or punctuation with '×' and dashes folded ('×' stays '×', '–' becomes '-'). */
  norm: string;
  pos: number;
}

class ShorthandFailure extends Error {
  constructor(readonly detail: ShorthandError) {
    super(detail.message);
  }
}

function fail(position: number, message: string, expected: string): never {
  throw new ShorthandFailure({ message, position, expected });
}

const PUNCT = new Set([',', '(', ')', '@', '-', '+', '/', '×']);
const DASHES = new Set(['–', '—', '−']);

function isLetter(c: string | undefined): boolean {
  return c !== undefined && /[A-Za-z]/.test(c);
}

function isDigit(c: string | undefined): boolean {
  return c !== undefined && c >= '0' && c <= '9';
}

function tokenize(text: string): Token[] {
  const tokens: Token[] = [];
  let i = 0;
  while (i < text.length) {
    const c = text[i] as string;
    if (/\s/.test(c)) {
      i++;
    } else if (isDigit(c)) {
      const start = i;
      while (isDigit(text[i])) i++;
      if (text[i] === ':' && isDigit(text[i + 1])) {
        while (text[i] === ':' && isDigit(text[i + 1])) {
          i++;
          while (isDigit(text[i])) i++;
        }
        tokens.push({ type: 'clock', text: text.slice(start, i), norm: text.slice(start, i), pos: start });
      } else {
        if (text[i] === '.' && isDigit(text[i + 1])) {
          i++;
          while (isDigit(text[i])) i++;
        }
        tokens.push({ type: 'number', text: text.slice(start, i), norm: text.slice(start, i), pos: start });
      }
    } else if (isLetter(c)) {
      const start = i;
      while (isLetter(text[i]) || (text[i] === '-' && isLetter(text[i + 1]) && isLetter(text[i - 1]))) i++;
      const word = text.slice(start, i);
      tokens.push({ type: 'word', text: word, norm: word.toLowerCase(), pos: start });
    } else if (PUNCT.has(c) || DASHES.has(c)) {
      tokens.push({ type: 'punct', text: c, norm: DASHES.has(c) ? '-' : c, pos: i });
      i++;
    } else {
      fail(i, `'${c}' has no meaning in a session plan.`, "a part like '2 mi easy', separated by commas");
    }
  }
  tokens.push({ type: 'end', text: '', norm: '', pos: text.length });
  return tokens;
}

// ---------------------------------------------------------------------------------------------
// Vocabulary

const DISTANCE_WORDS: Record<string, DistanceUnit> = {
  mi: 'mi',
  mile: 'mi',
  miles: 'mi',
  km: 'km',
  k: 'km',
  kms: 'km',
  kilometre: 'km',
  kilometres: 'km',
  kilometer: 'km',
  kilometers: 'km',
  m: 'm',
  metre: 'm',
  metres: 'm',
  meter: 'm',
  meters: 'm',
};

const TIME_WORDS: Record<string, number> = {
  h: 3600,
  hr: 3600,
  hrs: 3600,
  hour: 3600,
  hours: 3600,
  min: 60,
  mins: 60,
  minute: 60,
  minutes: 60,
  s: 1,
  sec: 1,
  secs: 1,
  second: 1,
  seconds: 1,
};

/** Longest phrases first so "recovery jog" wins over "recovery". */
const KIND_PHRASES: ReadonlyArray<[string[], PartKind]> = [
  [['warm', 'up'], 'warm-up'],
  [['cool', 'down'], 'cool-down'],
  [['goal', 'pace'], 'goal pace'],
  [['recovery', 'jog'], 'recovery jog'],
  [['warm-up'], 'warm-up'],
  [['warmup'], 'warm-up'],
  [['wu'], 'warm-up'],
  [['cool-down'], 'cool-down'],
  [['cooldown'], 'cool-down'],
  [['cd'], 'cool-down'],
  [['easy'], 'easy'],
  [['steady'], 'steady'],
  [['tempo'], 'tempo'],
  [['goal-pace'], 'goal pace'],
  [['rep'], 'rep'],
  [['reps'], 'rep'],
  [['recovery'], 'recovery jog'],
  [['jog'], 'recovery jog'],
  [['strides'], 'strides'],
  [['stride'], 'strides'],
];

/** How the formatter writes each kind. */
const KIND_WORD: Record<PartKind, string> = {
  'warm-up': 'warm-up',
  easy: 'easy',
  steady: 'steady',
  tempo: 'tempo',
  'goal pace': 'goal pace',
  rep: 'rep',
  'recovery jog': 'jog',
  'cool-down': 'cool-down',
  strides: 'strides',
};

const KIND_LIST = 'warm-up, easy, steady, tempo, goal pace, rep, jog, cool-down or strides';
const AMOUNT_EXPECTED = "a distance like '2 mi' or a time like '45 min'";
const TARGET_EXPECTED = "a pace like '7:05/mi', a race pace like 'MP' or a heart rate like '150-160 bpm'";
const UNIT_EXPECTED = 'a unit: mi, km, m, h, min or s';
const SEPARATOR_EXPECTED = "',' and the next part";

type Context = 'top' | 'repeat' | 'recovery';

/** The kind a part gets when none is written (see the module comment). */
function defaultKind(target: PartTarget, context: Context): PartKind {
  if (context === 'repeat') return 'rep';
  if (context === 'recovery') return 'recovery jog';
  if (target.type === 'effort') return 'easy';
  if (target.type === 'relative' && (target.ref === 'goal' || target.ref === 'MP')) return 'goal pace';
  return 'steady';
}

// ---------------------------------------------------------------------------------------------
// Parser

function quote(token: Token): string {
  return token.type === 'end' ? 'the end' : `'${token.text}'`;
}

function describePace(sPerKm: number): string {
  return `${formatPace(sPerKm)}/km`;
}

class Parser {
  private i = 0;

  constructor(private readonly tokens: Token[]) {}

  private peek(ahead = 0): Token {
    return this.tokens[Math.min(this.i + ahead, this.tokens.length - 1)] as Token;
  }

  private next(): Token {
    const t = this.peek();
    if (this.i < this.tokens.length - 1) this.i++;
    return t;
  }

  private isPunct(t: Token, p: string): boolean {
    return t.type === 'punct' && t.norm === p;
  }

  private isTimes(t: Token): boolean {
    return (t.type === 'word' && t.norm === 'x') || this.isPunct(t, '×');
  }

  private isWith(): boolean {
    const t = this.peek();
    return t.type === 'word' && ((t.norm === 'w' && this.isPunct(this.peek(1), '/')) || t.norm === 'with');
  }

  private isAt(t: Token): boolean {
    return this.isPunct(t, '@') || (t.type === 'word' && t.norm === 'at');
  }

  parsePlan(): PlanItem[] {
    const first = this.peek();
    if (first.type === 'end') {
      fail(
        first.pos,
        "Write the session, e.g. '2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-down'.",
        AMOUNT_EXPECTED,
      );
    }
    const items: PlanItem[] = [];
    let expanded = 0;
    for (;;) {
      const start = this.peek();
      if (this.isPunct(start, ',') || start.type === 'end') {
        fail(start.pos, `A part is missing before ${quote(start)}.`, AMOUNT_EXPECTED);
      }
      if (items.length === PLAN_LIMITS.maxItems) {
        fail(
          start.pos,
          `A session plan has at most ${PLAN_LIMITS.maxItems} parts and repeats; this is one more.`,
          'the end of the plan',
        );
      }
      const item = this.parseItem();
      expanded += countExpandedParts([item]);
      if (expanded > PLAN_LIMITS.maxExpandedParts) {
        fail(
          start.pos,
          `With its repeats unrolled this plan has more than ${PLAN_LIMITS.maxExpandedParts} parts; split it into several sessions.`,
          `at most ${PLAN_LIMITS.maxExpandedParts} parts with repeats unrolled`,
        );
      }
      items.push(item);
      const after = this.peek();
      if (after.type === 'end') return items;
      if (this.isPunct(after, ',')) {
        this.next();
        continue;
      }
      this.failAfterPart(after);
    }
  }

  /** Something other than ',' or the end follows a complete part: say what went wrong. */
  private failAfterPart(t: Token): never {
    if (this.peekKind() !== null) {
      fail(t.pos, `Write the kind before the target, e.g. '8 mi tempo @ 7:05/mi'.`, SEPARATOR_EXPECTED);
    }
    if (this.isAt(t)) fail(t.pos, 'A part has one target.', SEPARATOR_EXPECTED);
    if (this.isPunct(t, ')')) fail(t.pos, "This ')' closes no bracket.", SEPARATOR_EXPECTED);
    if (this.isWith()) {
      fail(t.pos, "'w/' adds a recovery to a repeat, e.g. '6 x 800 m w/ 400 m jog'.", SEPARATOR_EXPECTED);
    }
    fail(t.pos, `Expected a comma between parts, found ${quote(t)}.`, SEPARATOR_EXPECTED);
  }

  private parseItem(): PlanItem {
    const t = this.peek();
    if (this.isPunct(t, '(')) {
      fail(t.pos, "A group in brackets needs a count before it, e.g. '6 x (800 m @ 3:00, 400 m jog)'.", "a count like '6 x'");
    }
    if (this.isTimes(t)) fail(t.pos, "A repeat starts with its count, e.g. '6 x 800 m'.", "a count like '6'");
    if (t.type === 'number' && this.isTimes(this.peek(1))) return this.parseRepeat();
    return this.parsePart('top');
  }

  private parseRepeat(): Repeat {
    const countToken = this.next();
    const count = Number(countToken.text);
    if (!Number.isInteger(count) || count < 1 || count > PLAN_LIMITS.maxRepeatCount) {
      fail(
        countToken.pos,
        `A repeat is done 1 to ${PLAN_LIMITS.maxRepeatCount} times; '${countToken.text} x' is not possible here.`,
        `a whole count from 1 to ${PLAN_LIMITS.maxRepeatCount}`,
      );
    }
    this.next(); // x
    const parts: Part[] = [];
    const open = this.peek();
    if (this.isPunct(open, '(')) {
      this.next();
      for (;;) {
        parts.push(this.parseRepeatedPart());
        const t = this.peek();
        if (this.isPunct(t, ',')) {
          this.next();
          continue;
        }
        if (this.isPunct(t, ')')) {
          this.next();
          break;
        }
        fail(t.pos, `Expected ',' or ')' to close the bracket opened at ${open.pos}, found ${quote(t)}.`, "',' or ')'");
      }
    } else {
      parts.push(this.parseRepeatedPart());
    }
    if (this.isWith()) {
      if (this.next().norm === 'w') this.next(); // the '/' of 'w/'
      parts.push(this.parsePart('recovery'));
    }
    if (count * parts.length > PLAN_LIMITS.maxExpandedParts) {
      fail(
        countToken.pos,
        `${count} rounds of ${parts.length} parts is ${count * parts.length} parts; a session plan has at most ${PLAN_LIMITS.maxExpandedParts}.`,
        `at most ${PLAN_LIMITS.maxExpandedParts} parts with repeats unrolled`,
      );
    }
    return { type: 'repeat', count, parts };
  }

  private parseRepeatedPart(): Part {
    const t = this.peek();
    if (t.type === 'number' && this.isTimes(this.peek(1))) {
      fail(t.pos, 'A repeat cannot hold another repeat; write the rounds out or split the session.', AMOUNT_EXPECTED);
    }
    if (this.isPunct(t, '(')) fail(t.pos, 'Brackets cannot be nested.', AMOUNT_EXPECTED);
    return this.parsePart('repeat');
  }

  private parsePart(context: Context): Part {
    const amount = this.parseAmount();
    let kind: PartKind | null = null;
    const t = this.peek();
    if (t.type === 'word' && !this.isAt(t) && !this.isWith()) {
      kind = this.matchKind();
      if (kind === null) {
        if (this.isTimes(t)) fail(t.pos, "Write the count first, e.g. '6 x 800 m'.", "a kind, '@' and a target, or ','");
        fail(t.pos, `'${t.text}' is not a part kind: use ${KIND_LIST}.`, `a kind: ${KIND_LIST}`);
      }
    }
    let target: PartTarget = { type: 'effort' };
    if (this.isAt(this.peek())) {
      this.next();
      target = this.parseTarget(amount);
    }
    return { type: 'part', kind: kind ?? defaultKind(target, context), amount, target };
  }

  /** The kind phrase starting `ahead` tokens from here, and how many tokens it takes. */
  private peekKind(ahead = 0): { kind: PartKind; length: number } | null {
    for (const [words, kind] of KIND_PHRASES) {
      const fits = words.every((w, k) => {
        const t = this.peek(ahead + k);
        return t.type === 'word' && t.norm === w;
      });
      if (fits) return { kind, length: words.length };
    }
    return null;
  }

  /** Consumes a kind phrase if one starts here. */
  private matchKind(): PartKind | null {
    const found = this.peekKind();
    if (found === null) return null;
    for (let k = 0; k < found.length; k++) this.next();
    return found.kind;
  }

  private parseAmount(): PartAmount {
    const t = this.peek();
    if (this.peekKind() !== null) fail(t.pos, "Write the amount first, then the kind, e.g. '2 mi warm-up'.", AMOUNT_EXPECTED);
    this.next();
    if (t.type === 'clock') {
      fail(t.pos, `Write '${t.text}' as a time with its unit, e.g. '20 min' or '1 h 5 min'.`, AMOUNT_EXPECTED);
    }
    if (t.type !== 'number')
      fail(t.pos, `Expected a distance like '2 mi' or a time like '45 min', found ${quote(t)}.`, AMOUNT_EXPECTED);
    const value = Number(t.text);
    const unitToken = this.peek();
    if (unitToken.type !== 'word' || this.peekKind() !== null) {
      fail(unitToken.pos, `'${t.text}' needs a unit, e.g. '${t.text} mi' or '${t.text} min'.`, UNIT_EXPECTED);
    }
    this.next();
    const distanceUnit = DISTANCE_WORDS[unitToken.norm];
    if (distanceUnit !== undefined) {
      if (!(value > 0)) fail(t.pos, 'A distance must be more than 0.', 'a distance more than 0');
      const distance_m = distanceFromWritten(value, distanceUnit);
      if (distance_m < PLAN_LIMITS.minDistanceM) fail(t.pos, 'A part is at least 1 m long.', 'a distance of at least 1 m');
      if (distance_m > PLAN_LIMITS.maxDistanceM) fail(t.pos, 'A part is at most 250 km long.', 'a distance of at most 250 km');
      return { type: 'distance', distance_m, unit: distanceUnit };
    }
    const unitSeconds = TIME_WORDS[unitToken.norm];
    if (unitSeconds === undefined)
      fail(unitToken.pos, `'${unitToken.text}' is not a unit: use mi, km, m, h, min or s.`, UNIT_EXPECTED);
    let total = value * unitSeconds;
    let smallest = unitSeconds;
    // "1 h 30 min": further number-unit pairs in smaller units add up.
    for (;;) {
      const n = this.peek();
      const u = this.peek(1);
      const more = n.type === 'number' && u.type === 'word' ? TIME_WORDS[u.norm] : undefined;
      if (more === undefined || more >= smallest) break;
      this.next();
      this.next();
      total += Number(n.text) * more;
      smallest = more;
    }
    const duration_s = Math.round(total);
    if (!(duration_s >= PLAN_LIMITS.minDurationS)) fail(t.pos, 'A time must be at least 1 s.', 'a time of at least 1 s');
    if (duration_s > PLAN_LIMITS.maxDurationS) fail(t.pos, 'A part lasts at most 24 h.', 'a time of at most 24 h');
    return { type: 'duration', duration_s };
  }

  private parseTarget(amount: PartAmount): PartTarget {
    const t = this.peek();
    if (t.type === 'clock') return this.parsePace(amount);
    if (t.type === 'number' && this.peek(1).type === 'word' && this.peek(1).norm === 'k') return this.parseRacePace();
    if (t.type === 'number') return this.parseHeartRate();
    if (t.type === 'word' && ['goal', 'mp', 'hmp'].includes(t.norm)) return this.parseRacePace();
    fail(t.pos, `Expected a target after '@', found ${quote(t)}.`, TARGET_EXPECTED);
  }

  /** `m:ss` or `h:mm:ss` in whole seconds. */
  private readClock(t: Token): number {
    const fields = t.text.split(':');
    if (fields.length > 3) fail(t.pos, `'${t.text}' is not a time: write m:ss or h:mm:ss.`, "a time like '7:05' or '1:05:00'");
    const [first, ...rest] = fields.map(Number) as [number, ...number[]];
    rest.forEach((v, k) => {
      const raw = fields[k + 1] as string;
      if (raw.length !== 2 || v > 59) {
        fail(
          t.pos,
          `'${t.text}' is not a time: minutes and seconds after ':' run from 00 to 59.`,
          "a time like '7:05' or '1:05:00'",
        );
      }
    });
    return rest.reduce((acc, v) => acc * 60 + v, first);
  }

  private parsePace(amount: PartAmount): PartTarget {
    const fastToken = this.next();
    const fastW = this.readClock(fastToken);
    let slowW = fastW;
    let slowToken = fastToken;
    if (this.isPunct(this.peek(), '-')) {
      this.next();
      slowToken = this.next();
      if (slowToken.type !== 'clock') {
        fail(slowToken.pos, "A pace range is written fast-slow, e.g. '7:05-7:15/mi'.", "the slow end of the range, like '7:15'");
      }
      slowW = this.readClock(slowToken);
    }
    let per: PacePer = 'rep';
    if (this.isPunct(this.peek(), '/')) {
      this.next();
      const u = this.next();
      const unit = u.type === 'word' ? DISTANCE_WORDS[u.norm] : undefined;
      if (unit !== 'mi' && unit !== 'km') fail(u.pos, `Expected 'mi' or 'km' after '/', found ${quote(u)}.`, "'mi' or 'km'");
      per = unit;
    }
    const unitText = per === 'rep' ? '' : `/${per}`;
    if (fastW === 0 || slowW === 0) {
      fail(fastW === 0 ? fastToken.pos : slowToken.pos, 'A pace must be more than 0:00.', 'a pace more than 0:00');
    }
    if (fastW > slowW) {
      fail(
        fastToken.pos,
        `A pace range is written fast-slow, e.g. '${slowToken.text}-${fastToken.text}${unitText}'.`,
        'the faster pace first',
      );
    }
    let partDistance: number | null = null;
    if (per === 'rep') {
      if (amount.type !== 'distance') {
        fail(
          fastToken.pos,
          `A pace without /mi or /km is the time for the part's distance, and this part is timed: write '${fastToken.text}/mi' or '${fastToken.text}/km'.`,
          "a pace like '7:05/mi' or '4:25/km'",
        );
      }
      partDistance = amount.distance_m;
    }
    const fast = paceFromWritten(fastW, per, partDistance);
    const slow = paceFromWritten(slowW, per, partDistance);
    for (const [pace, token] of [
      [fast, fastToken],
      [slow, slowToken],
    ] as const) {
      if (pace < PLAN_LIMITS.fastestPaceSPerKm || pace > PLAN_LIMITS.slowestPaceSPerKm) {
        const hint = per === 'rep' ? this.unitHint(token) : '';
        fail(
          token.pos,
          `${token.text}${unitText} is ${describePace(pace)}, outside the 1:30–20:00 per km this accepts.${hint}`,
          per === 'rep'
            ? `a time for the part's ${describeAmount(amount)}, or a pace with /mi or /km`
            : 'a pace from 1:30 to 20:00 per km',
        );
      }
    }
    return { type: 'pace', fast_s_per_km: fast, slow_s_per_km: slow, per };
  }

  /** " Did you mean 7:05/mi?" when a time written without a unit would make sense per mile or per km. */
  private unitHint(token: Token): string {
    const w = this.readClock(token);
    const fits = (['mi', 'km'] as const).filter((u) => {
      const p = paceFromWritten(w, u, null);
      return p >= PLAN_LIMITS.fastestPaceSPerKm && p <= PLAN_LIMITS.slowestPaceSPerKm;
    });
    return fits.length > 0 ? ` Did you mean ${fits.map((u) => `${token.text}/${u}`).join(' or ')}?` : '';
  }

  private parseRacePace(): PartTarget {
    const t = this.next();
    let ref: RelativePaceRef;
    if (t.type === 'number') {
      this.next(); // the K
      if (t.text === '10') ref = '10K';
      else if (t.text === '5') ref = '5K';
      else fail(t.pos, `'${t.text}K' is not a race pace here: use goal, MP, HMP, 10K or 5K.`, 'goal, MP, HMP, 10K or 5K');
    } else if (t.norm === 'goal') {
      if (this.peek().type === 'word' && this.peek().norm === 'pace') this.next();
      ref = 'goal';
    } else {
      ref = t.norm === 'mp' ? 'MP' : 'HMP';
    }
    if (ref !== 'goal' && this.peek().type === 'word' && this.peek().norm === 'pace') this.next();
    const sign = this.peek();
    if (!this.isPunct(sign, '+') && !this.isPunct(sign, '-')) return { type: 'relative', ref };
    this.next();
    const offsetExpected = `an offset like '${ref}+10s/mi'`;
    const n = this.next();
    if (n.type !== 'number' || !/^\d+$/.test(n.text)) {
      fail(n.pos, `Write an offset in whole seconds, e.g. '${ref}+10s/mi'.`, offsetExpected);
    }
    const s = this.next();
    if (s.type !== 'word' || TIME_WORDS[s.norm] !== 1) {
      fail(s.pos, `Write an offset in seconds, e.g. '${ref}+10s/mi'.`, offsetExpected);
    }
    const slash = this.next();
    const u = this.next();
    const unit = u.type === 'word' ? DISTANCE_WORDS[u.norm] : undefined;
    if (!this.isPunct(slash, '/') || (unit !== 'mi' && unit !== 'km')) {
      fail(slash.pos, `Say whether the offset is per mile or per km, e.g. '${ref}+${n.text}s/mi'.`, "'/mi' or '/km'");
    }
    const written = Number(n.text) * (sign.norm === '-' ? -1 : 1);
    if (written === 0) fail(n.pos, `An offset of 0 s: write just '${ref}'.`, 'an offset of at least 1 s');
    const sPerKm = paceFromWritten(written, unit, null);
    if (Math.abs(sPerKm) > PLAN_LIMITS.maxOffsetSPerKm) {
      fail(n.pos, 'An offset is at most 2:00 per km (3:13 per mile) either way.', 'a smaller offset');
    }
    return { type: 'relative', ref, offset: { s_per_km: sPerKm, per: unit } };
  }

  private parseHeartRate(): PartTarget {
    const lowToken = this.next();
    let highToken = lowToken;
    if (this.isPunct(this.peek(), '-')) {
      this.next();
      highToken = this.next();
    }
    const bpm = this.peek();
    if (highToken.type !== 'number' || bpm.type !== 'word' || bpm.norm !== 'bpm') {
      fail(
        lowToken.pos,
        "A heart rate ends in bpm, e.g. '150-160 bpm'; a pace is written m:ss, e.g. '7:05/mi'.",
        TARGET_EXPECTED,
      );
    }
    this.next();
    const low = Number(lowToken.text);
    const high = Number(highToken.text);
    for (const [v, token] of [
      [low, lowToken],
      [high, highToken],
    ] as const) {
      if (!Number.isInteger(v) || v < PLAN_LIMITS.minHeartRate || v > PLAN_LIMITS.maxHeartRate) {
        fail(token.pos, 'A heart rate is a whole number from 30 to 240 bpm.', 'a heart rate from 30 to 240 bpm');
      }
    }
    if (low > high) {
      fail(lowToken.pos, `A heart-rate range is written low-high, e.g. '${high}-${low} bpm'.`, 'the lower heart rate first');
    }
    return { type: 'heart_rate', low_bpm: low, high_bpm: high };
  }
}

function describeAmount(amount: PartAmount): string {
  return amount.type === 'distance' ? formatAmount(amount) : 'time';
}

/**
 * Parses the shorthand into plan items. Strict: on the first mistake it answers where (0-based
 * character index), what it expected, and a sentence for the person writing. Paces are stored in
 * seconds per km; limits are PLAN_LIMITS. Never throws.
 */
export function parseShorthand(text: string): ShorthandResult {
  if (text.length > PLAN_LIMITS.maxTextLength) {
    return {
      ok: false,
      error: {
        message: `Keep the shorthand under ${PLAN_LIMITS.maxTextLength} characters.`,
        position: PLAN_LIMITS.maxTextLength,
        expected: 'a shorter plan',
      },
    };
  }
  try {
    return { ok: true, items: new Parser(tokenize(text)).parsePlan() };
  } catch (e) {
    if (e instanceof ShorthandFailure) return { ok: false, error: e.detail };
    throw e;
  }
}

// ---------------------------------------------------------------------------------------------
// Normalisation and formatting

/**
 * The items as the shorthand can say them, i.e. exactly what `parseShorthand(formatShorthand(items))`
 * gives back: distances to three decimals of their written unit, durations and heart rates to whole
 * numbers, paces and offsets to whole seconds in their written unit (a rep pace over the part's
 * normalised distance), an offset that rounds to 0 dropped. Idempotent; inputs are not mutated.
 */
export function normaliseItems(items: readonly PlanItem[]): PlanItem[] {
  return items.map((item) =>
    item.type === 'part' ? normalisePart(item) : { type: 'repeat', count: item.count, parts: item.parts.map(normalisePart) },
  );
}

function normalisePart(part: Part): Part {
  const amount: PartAmount =
    part.amount.type === 'distance'
      ? {
          type: 'distance',
          distance_m: distanceFromWritten(distanceToWritten(part.amount.distance_m, part.amount.unit), part.amount.unit),
          unit: part.amount.unit,
        }
      : { type: 'duration', duration_s: Math.round(part.amount.duration_s) };
  return { type: 'part', kind: part.kind, amount, target: normaliseTarget(part.target, amount) };
}

function normaliseTarget(target: PartTarget, amount: PartAmount): PartTarget {
  switch (target.type) {
    case 'pace': {
      const d = amount.type === 'distance' ? amount.distance_m : null;
      const round = (p: number): number => paceFromWritten(Math.round(paceToWritten(p, target.per, d)), target.per, d);
      return {
        type: 'pace',
        fast_s_per_km: round(target.fast_s_per_km),
        slow_s_per_km: round(target.slow_s_per_km),
        per: target.per,
      };
    }
    case 'relative': {
      if (!target.offset) return { type: 'relative', ref: target.ref };
      const written = Math.round(paceToWritten(target.offset.s_per_km, target.offset.per, null));
      if (written === 0) return { type: 'relative', ref: target.ref };
      return {
        type: 'relative',
        ref: target.ref,
        offset: { s_per_km: paceFromWritten(written, target.offset.per, null), per: target.offset.per },
      };
    }
    case 'heart_rate':
      return { type: 'heart_rate', low_bpm: Math.round(target.low_bpm), high_bpm: Math.round(target.high_bpm) };
    case 'effort':
      return { type: 'effort' };
  }
}

function formatAmount(amount: PartAmount): string {
  if (amount.type === 'distance') return `${String(distanceToWritten(amount.distance_m, amount.unit))} ${amount.unit}`;
  const s = Math.round(amount.duration_s);
  if (s % 3600 === 0) return `${s / 3600} h`;
  if (s % 60 === 0) return `${s / 60} min`;
  if (s < 600) return `${s} s`;
  return `${Math.floor(s / 60)} min ${s % 60} s`;
}

function formatTarget(target: PartTarget, amount: PartAmount): string {
  switch (target.type) {
    case 'pace': {
      const d = amount.type === 'distance' ? amount.distance_m : null;
      const fast = Math.round(paceToWritten(target.fast_s_per_km, target.per, d));
      const slow = Math.round(paceToWritten(target.slow_s_per_km, target.per, d));
      const range = slow === fast ? formatPace(fast) : `${formatPace(fast)}-${formatPace(slow)}`;
      return target.per === 'rep' ? range : `${range}/${target.per}`;
    }
    case 'relative': {
      if (!target.offset) return target.ref;
      const w = Math.round(paceToWritten(target.offset.s_per_km, target.offset.per, null));
      return `${target.ref}${w < 0 ? '-' : '+'}${Math.abs(w)}s/${target.offset.per}`;
    }
    case 'heart_rate':
      return target.low_bpm === target.high_bpm ? `${target.low_bpm} bpm` : `${target.low_bpm}-${target.high_bpm} bpm`;
    case 'effort':
      return '';
  }
}

function formatPart(part: Part, context: Context): string {
  const showKind =
    context === 'recovery' ||
    (context === 'repeat' && part.kind !== 'rep') ||
    (context === 'top' && (part.target.type === 'effort' || part.kind !== defaultKind(part.target, 'top')));
  const words = [formatAmount(part.amount)];
  if (showKind) words.push(KIND_WORD[part.kind]);
  if (part.target.type !== 'effort') words.push('@', formatTarget(part.target, part.amount));
  return words.join(' ');
}

function formatRepeat(repeat: Repeat): string {
  const [first, second] = repeat.parts;
  if (first && repeat.parts.length === 1) return `${repeat.count} x ${formatPart(first, 'repeat')}`;
  if (first && second && repeat.parts.length === 2 && second.kind === 'recovery jog') {
    return `${repeat.count} x ${formatPart(first, 'repeat')} w/ ${formatPart(second, 'recovery')}`;
  }
  return `${repeat.count} x (${repeat.parts.map((p) => formatPart(p, 'repeat')).join(', ')})`;
}

/**
 * Writes items as canonical shorthand (`2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog`): kinds
 * that parsing would fill in are left out, a two-part repeat ending in a jog uses 'w/', paces are
 * shown in the unit they were written in. `parseShorthand` of the result equals `normaliseItems(items)`.
 */
export function formatShorthand(items: readonly PlanItem[]): string {
  return normaliseItems(items)
    .map((item) => (item.type === 'part' ? formatPart(item, 'top') : formatRepeat(item)))
    .join(', ');
}
