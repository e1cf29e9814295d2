/**
 * The currencies a coach can charge in, with their minor-unit exponent and our limits.
 *
 * Exponents are ISO 4217's "minor unit" column (the list kept by the ISO 4217 maintenance agency, SIX):
 * 2 for USD, EUR, GBP, CAD, AUD, NZD, CHF and SEK, 0 for JPY. tests/unit/shared/fees-money.test.ts checks them
 * against the runtime's own currency data (Intl / CLDR), a second source outside the project.
 *
 * Limits are our own choice, in minor units: the smallest fee is at or above the payment service's published
 * minimum charge for the currency; the largest (about a thousand US dollars a month) stops a typo such as an extra
 * zero from charging a runner a fortune.
 */
export const CURRENCIES = {
  USD: { exponent: 2, min_minor: 100, max_minor: 100_000 },
  EUR: { exponent: 2, min_minor: 100, max_minor: 100_000 },
  GBP: { exponent: 2, min_minor: 100, max_minor: 100_000 },
  CAD: { exponent: 2, min_minor: 100, max_minor: 150_000 },
  AUD: { exponent: 2, min_minor: 100, max_minor: 150_000 },
  NZD: { exponent: 2, min_minor: 100, max_minor: 150_000 },
  CHF: { exponent: 2, min_minor: 100, max_minor: 100_000 },
  SEK: { exponent: 2, min_minor: 500, max_minor: 1_000_000 },
  JPY: { exponent: 0, min_minor: 100, max_minor: 150_000 },
} as const;

export type CurrencyCode = keyof typeof CURRENCIES;
export const CURRENCY_CODES = Object.keys(CURRENCIES) as [CurrencyCode, ...CurrencyCode[]];

export function isCurrencyCode(value: string): value is CurrencyCode {
  return Object.hasOwn(CURRENCIES, value);
}

/** 4500 USD minor units → "45.00" (no floating point: integer division and padding). */
export function minorToDecimalText(amountMinor: number, currency: CurrencyCode): string {
  const { exponent } = CURRENCIES[currency];
  const negative = amountMinor < 0;
  const digits = String(Math.abs(amountMinor)).padStart(exponent + 1, '0');
  const text = exponent === 0 ? digits : `${digits.slice(0, -exponent)}.${digits.slice(-exponent)}`;
  return negative ? `-${text}` : text;
}

/**
 * What a coach types ("45", "45.5", "45.50", "1,200.00" is refused: no grouping) → integer minor units, or null
 * when the text is not a plain amount with at most the currency's number of decimals. Parsed digit by digit, never
 * through a float, so 0.29 stays 29 cents.
 */
export function decimalTextToMinor(text: string, currency: CurrencyCode): number | null {
  const { exponent } = CURRENCIES[currency];
  const match = /^(\d{1,9})(?:[.,](\d*))?$/.exec(text.trim());
  if (!match) return null;
  const fraction = match[2] ?? '';
  if (fraction.length > exponent) return null;
  return Number(match[1]) * 10 ** exponent + Number(fraction.padEnd(exponent, '0') || '0');
}

/**
 * An amount for people, in the viewer's locale: `Intl.NumberFormat` with the currency, so 4500 USD reads "$45.00"
 * in en-US and "45,00 $US" in fr-FR. The number handed to Intl is built from the integer by dividing by a power of
 * ten, which is exact for every amount under our limits (all well below 2^53).
 */
export function formatMoney(amountMinor: number, currency: string, locale?: string): string {
  const exponent = isCurrencyCode(currency) ? CURRENCIES[currency].exponent : 2;
  return new Intl.NumberFormat(locale, {
    style: 'currency',
    currency,
    minimumFractionDigits: exponent,
    maximumFractionDigits: exponent,
  }).format(amountMinor / 10 ** exponent);
}
