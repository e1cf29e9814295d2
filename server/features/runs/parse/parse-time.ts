const ISO_TIME = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d+))?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;

/**
 * ISO 8601 date-time (as GPX and TCX write it) → ms since the epoch, or NaN when it is not one.
 * A time without a zone is taken as UTC (GPX 1.1 requires UTC; reading it as the server's local
 * time would make imports depend on the machine). Fractions beyond milliseconds are rounded.
 */
export function parseIsoTime(text: string): number {
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
  const trimmed = text.trim();
  if (trimmed === '' || !/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(trimmed)) return Number.NaN;
  return Number(trimmed);
}
