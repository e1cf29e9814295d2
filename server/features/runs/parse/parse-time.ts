const ISO_TIME = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d+))?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

const MS_PER_DAY = 86_400_000;
const CODE_0 = 48;
const CODE_DOT = 46;
const CODE_PLUS = 43;
const CODE_MINUS = 45;
/** Exact powers of ten: a double holds 10^k exactly up to k = 22. */
const POW10 = Float64Array.from({ length: 23 }, (_, k) => 10 ** k);
/** Integers up to this are exact in a double (2^53). */
const MAX_EXACT_INTEGER = 9_007_199_254_740_992;

/**
 * ISO 8601 date-time (as GPX and TCX write it) → ms since the epoch, or NaN when it is not one.
 * A time without a zone is taken as UTC (GPX 1.1 requires UTC; reading it as the server's local
 * time would make imports depend on the machine). Fractions beyond milliseconds are rounded.
 */
export function parseIsoTime(text: string): number {
  const length = copyAscii(text);
  if (length >= 0 && readCommonIsoTime(SCRATCH, 0, length, RESULT, 0)) return RESULT[0] as number;
  return parseAnyIsoTime(text);
}

/** Where the string readers take their result from the code readers. */
const RESULT = new Float64Array(1);

/** Room for the ASCII codes of a short text, so strings and bytes share one digit reader. */
const SCRATCH = new Uint8Array(64);

/** Copy `text` into SCRATCH and give its length, or −1 when it is too long or not all ASCII. */
function copyAscii(text: string): number {
  const length = text.length;
  if (length > SCRATCH.length) return -1;
  for (let i = 0; i < length; i++) {
    const code = text.charCodeAt(i);
    if (code > 127) return -1;
    SCRATCH[i] = code;
  }
  return length;
}

/**
 * The form nearly every device writes, `YYYY-MM-DDThh:mm:ss[.f{1,3}](Z|±hh:mm)`, read digit by
 * digit from the ASCII codes[start, end) into out[i]: a 1 s file has one per point, and the
 * regular expression below cost more than the rest of reading the point. For anything else it
 * writes nothing and gives false (`parseIsoTime` decides); for everything it accepts it writes
 * what `parseIsoTime` gives. (It writes rather than returns: a double returned from a call the
 * engine does not inline is boxed, once per value of a 100 000-point file.)
 */
export function readCommonIsoTime(codes: Uint8Array, start: number, end: number, out: Float64Array, i: number): boolean {
  const length = end - start;
  if (length < 20 || codes[start + 4] !== 45 || codes[start + 7] !== 45 || codes[start + 10] !== 84) return false;
  if (codes[start + 13] !== 58 || codes[start + 16] !== 58) return false;
  const year = digitsAt(codes, start, 4);
  const month = digitsAt(codes, start + 5, 2);
  const day = digitsAt(codes, start + 8, 2);
  const hour = digitsAt(codes, start + 11, 2);
  const minute = digitsAt(codes, start + 14, 2);
  const second = digitsAt(codes, start + 17, 2);
  // Years 0–99 mean 1900–1999 to Date.UTC; leave that oddity to the general reader.
  if (year < 100 || month < 0 || day < 0 || hour < 0 || minute < 0 || second < 0) return false;
  let at = start + 19;
  let ms = 0;
  if (codes[at] === CODE_DOT) {
    let digits = 0;
    at++;
    while (at < end && isDigit(codes[at] as number)) {
      ms = ms * 10 + (codes[at] as number) - CODE_0;
      digits++;
      at++;
    }
    // Beyond milliseconds the general reader rounds; 1–3 digits are exact here.
    if (digits === 0 || digits > 3) return false;
    ms *= POW10[3 - digits] as number;
  }
  let offsetMinutes = 0;
  const zone = at < end ? codes[at] : -1;
  if (zone === 90 && at + 1 === end) {
    // Z
  } else if ((zone === CODE_PLUS || zone === CODE_MINUS) && at + 6 === end && codes[at + 3] === 58) {
    const zoneHours = digitsAt(codes, at + 1, 2);
    const zoneMinutes = digitsAt(codes, at + 4, 2);
    if (zoneHours < 0 || zoneMinutes < 0) return false;
    offsetMinutes = (zone === CODE_MINUS ? -1 : 1) * (zoneHours * 60 + zoneMinutes);
  } else return false;
  if (month < 1 || month > 12 || day < 1 || day > 31 || hour > 24 || minute > 59 || second > 60) {
    out[i] = Number.NaN;
    return true;
  }
  // Date.UTC's arithmetic: days past the month's end, hour 24 and second 60 roll over.
  const days = daysFromCivil(year, month) + day - 1;
  out[i] = days * MS_PER_DAY + hour * 3_600_000 + (minute - offsetMinutes) * 60_000 + second * 1000 + ms;
  return true;
}

/** Days from 1970-01-01 to the first of the month (proleptic Gregorian; H. Hinnant's days_from_civil). */
function daysFromCivil(year: number, month: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yearOfEra = y - era * 400;
  const dayOfYear = Math.floor((153 * (month > 2 ? month - 3 : month + 9) + 2) / 5);
  const dayOfEra = yearOfEra * 365 + Math.floor(yearOfEra / 4) - Math.floor(yearOfEra / 100) + dayOfYear;
  return era * 146_097 + dayOfEra - 719_468;
}

function isDigit(code: number): boolean {
  return code >= CODE_0 && code <= 57;
}

/** The decimal value of `count` digits at `start` (callers keep them inside the text), or −1 when one is not a digit. */
function digitsAt(codes: Uint8Array, start: number, count: number): number {
  let value = 0;
  for (let i = start; i < start + count; i++) {
    const code = codes[i] as number;
    if (!isDigit(code)) return -1;
    value = value * 10 + code - CODE_0;
  }
  return value;
}

/** The general ISO 8601 reader behind `parseIsoTime` (exported for the tests that compare the fast readers with it). */
export function parseAnyIsoTime(text: string): number {
  const m = ISO_TIME.exec(text.trim());
  if (!m) return Number.NaN;
  const [, y, mo, d, h, mi, s, frac, zone] = m;
  const month = Number(mo);
  const day = Number(d);
  const hour = Number(h);
  const minute = Number(mi);
  const second = s === undefined ? 0 : Number(s);
  if (month < 1 || month > 12 || day < 1 || day > 31 || hour > 24 || minute > 59 || second > 60) return Number.NaN;
  const ms = frac === undefined ? 0 : Math.round(Number(`0.${frac}`) * 1000);
  let t = Date.UTC(Number(y), month - 1, day, hour, minute, second, ms);
  if (zone && zone.toUpperCase() !== 'Z') {
    const sign = zone.startsWith('-') ? -1 : 1;
    const digits = zone.slice(1).replace(':', '');
    const offsetMin = Number(digits.slice(0, 2)) * 60 + (digits.length > 2 ? Number(digits.slice(2, 4)) : 0);
    t -= sign * offsetMin * 60_000;
  }
  return t;
}

/** A decimal number as written in a file, or NaN (never a partial parse like parseFloat's). */
export function parseNumber(text: string | undefined): number {
  if (text === undefined) return Number.NaN;
  const length = copyAscii(text);
  if (length >= 0 && readPlainDecimal(SCRATCH, 0, length, RESULT, 0)) return RESULT[0] as number;
  return parseAnyNumber(text);
}

/** The general number reader behind `parseNumber` (exported for the tests that compare the fast readers with it). */
export function parseAnyNumber(text: string): number {
  const trimmed = text.trim();
  if (trimmed === '' || !DECIMAL.test(trimmed)) return Number.NaN;
  return Number(trimmed);
}

/**
 * `[+-]digits[.digits]` in the ASCII codes[start, end) with at most 15 significant digits and no
 * spaces, read digit by digit into out[i]. The digits as an integer and the power of ten are both
 * exact doubles, so one division rounds correctly and gives exactly what `Number()` gives
 * (Clinger's fast path). False, and nothing written, otherwise (`parseNumber` decides).
 */
export function readPlainDecimal(codes: Uint8Array, start: number, end: number, out: Float64Array, i: number): boolean {
  const first = codes[start];
  const signed = first === CODE_MINUS || first === CODE_PLUS;
  let mantissa = 0;
  let significantDigits = 0;
  let wholeDigits = 0;
  let fractionDigits = -1;
  for (let at = signed ? start + 1 : start; at < end; at++) {
    const code = codes[at] as number;
    if (isDigit(code)) {
      mantissa = mantissa * 10 + code - CODE_0;
      if (mantissa > 0) significantDigits++;
      if (fractionDigits >= 0) fractionDigits++;
      else wholeDigits++;
    } else if (code === CODE_DOT && fractionDigits < 0) {
      fractionDigits = 0;
    } else return false;
  }
  // "", "+", "." and "-." are not numbers; those and long digit strings go to the general reader.
  if (wholeDigits === 0 && fractionDigits <= 0) return false;
  if (significantDigits > 15 || mantissa > MAX_EXACT_INTEGER || fractionDigits > 22) return false;
  const scale = fractionDigits <= 0 ? 1 : (POW10[fractionDigits] as number);
  out[i] = ((first === CODE_MINUS ? -1 : 1) * mantissa) / scale;
  return true;
}
