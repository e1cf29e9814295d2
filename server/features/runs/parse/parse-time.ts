const ISO_TIME = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d+))?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

const MS_PER_DAY = 86_400_000;
const CODE_0 = 48;
const CODE_DOT = 46;
const CODE_PLUS = 43;
const CODE_MINUS = 45;
/** Exact powers of ten: a double holds 10^k exactly up to k = 22. */
const POW10 = Array.from({ length: 23 }, (_, k) => 10 ** k);
/** Integers up to this are exact in a double (2^53). */
const MAX_EXACT_INTEGER = 9_007_199_254_740_992;

/**
 * ISO 8601 date-time (as GPX and TCX write it) → ms since the epoch, or NaN when it is not one.
 * A time without a zone is taken as UTC (GPX 1.1 requires UTC; reading it as the server's local
 * time would make imports depend on the machine). Fractions beyond milliseconds are rounded.
 */
export function parseIsoTime(text: string): number {
  const fast = parseCommonIsoTime(text);
  return fast === undefined ? parseAnyIsoTime(text) : fast;
}

/**
 * The form nearly every device writes, `YYYY-MM-DDThh:mm:ss[.f{1,3}](Z|±hh:mm)`, read digit by
 * digit: a 1 s file has one per point, and the regular expression below cost more than the rest
 * of reading the point. Gives undefined for anything else (the general reader decides), and the
 * same number as the general reader for everything it accepts.
 */
function parseCommonIsoTime(text: string): number | undefined {
  const length = text.length;
  if (length < 20 || text.charCodeAt(4) !== 45 || text.charCodeAt(7) !== 45 || text.charCodeAt(10) !== 84) return undefined;
  if (text.charCodeAt(13) !== 58 || text.charCodeAt(16) !== 58) return undefined;
  const year = digitsAt(text, 0, 4);
  const month = digitsAt(text, 5, 2);
  const day = digitsAt(text, 8, 2);
  const hour = digitsAt(text, 11, 2);
  const minute = digitsAt(text, 14, 2);
  const second = digitsAt(text, 17, 2);
  // Years 0–99 mean 1900–1999 to Date.UTC; leave that oddity to the general reader.
  if (year < 100 || month < 0 || day < 0 || hour < 0 || minute < 0 || second < 0) return undefined;
  let at = 19;
  let ms = 0;
  if (text.charCodeAt(at) === CODE_DOT) {
    let digits = 0;
    at++;
    while (at < length && isDigit(text.charCodeAt(at))) {
      ms = ms * 10 + text.charCodeAt(at) - CODE_0;
      digits++;
      at++;
    }
    // Beyond milliseconds the general reader rounds; 1–3 digits are exact here.
    if (digits === 0 || digits > 3) return undefined;
    ms *= POW10[3 - digits] as number;
  }
  let offsetMinutes = 0;
  const zone = text.charCodeAt(at);
  if (zone === 90 && at + 1 === length) {
    // Z
  } else if ((zone === CODE_PLUS || zone === CODE_MINUS) && at + 6 === length && text.charCodeAt(at + 3) === 58) {
    const zoneHours = digitsAt(text, at + 1, 2);
    const zoneMinutes = digitsAt(text, at + 4, 2);
    if (zoneHours < 0 || zoneMinutes < 0) return undefined;
    offsetMinutes = (zone === CODE_MINUS ? -1 : 1) * (zoneHours * 60 + zoneMinutes);
  } else return undefined;
  if (month < 1 || month > 12 || day < 1 || day > 31 || hour > 24 || minute > 59 || second > 60) return Number.NaN;
  // Date.UTC's arithmetic: days past the month's end, hour 24 and second 60 roll over.
  const days = daysFromCivil(year, month) + day - 1;
  return days * MS_PER_DAY + hour * 3_600_000 + (minute - offsetMinutes) * 60_000 + second * 1000 + ms;
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

/** The decimal value of `count` digits at `start`, or −1 when one of them is not a digit. */
function digitsAt(text: string, start: number, count: number): number {
  let value = 0;
  for (let i = start; i < start + count; i++) {
    const code = text.charCodeAt(i);
    if (!isDigit(code)) return -1;
    value = value * 10 + code - CODE_0;
  }
  return value;
}

function parseAnyIsoTime(text: string): number {
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
  const fast = parsePlainDecimal(text);
  if (fast !== undefined) return fast;
  const trimmed = text.trim();
  if (trimmed === '' || !DECIMAL.test(trimmed)) return Number.NaN;
  return Number(trimmed);
}

/**
 * `[+-]digits[.digits]` with at most 15 significant digits and no spaces, read digit by digit.
 * The digits as an integer and the power of ten are both exact doubles, so one division rounds
 * correctly and gives exactly what `Number()` gives (Clinger's fast path). Undefined otherwise.
 */
function parsePlainDecimal(text: string): number | undefined {
  const length = text.length;
  const first = text.charCodeAt(0);
  const signed = first === CODE_MINUS || first === CODE_PLUS;
  let mantissa = 0;
  let significantDigits = 0;
  let wholeDigits = 0;
  let fractionDigits = -1;
  for (let at = signed ? 1 : 0; at < length; at++) {
    const code = text.charCodeAt(at);
    if (isDigit(code)) {
      mantissa = mantissa * 10 + code - CODE_0;
      if (mantissa > 0) significantDigits++;
      if (fractionDigits >= 0) fractionDigits++;
      else wholeDigits++;
    } else if (code === CODE_DOT && fractionDigits < 0) {
      fractionDigits = 0;
    } else return undefined;
  }
  // "", "+", "." and "-." are not numbers; those and long digit strings go to the general reader.
  if (wholeDigits === 0 && fractionDigits <= 0) return undefined;
  if (significantDigits > 15 || mantissa > MAX_EXACT_INTEGER) return undefined;
  const scale = fractionDigits <= 0 ? 1 : POW10[fractionDigits];
  if (scale === undefined) return undefined;
  return ((first === CODE_MINUS ? -1 : 1) * mantissa) / scale;
}
