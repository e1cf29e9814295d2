import { describe, expect, it } from 'vitest';
import { addDays, billingStatus, daysBetween, lastDayBefore } from '../../../../shared/fees/billing-status.ts';
import {
  CURRENCIES,
  CURRENCY_CODES,
  decimalTextToMinor,
  formatMoney,
  minorToDecimalText,
} from '../../../../shared/fees/currencies.ts';
import { FeeInputSchema } from '../../../../shared/fees/schemas.ts';

describe('currency exponents', () => {
  it('match the runtime’s own currency data (CLDR, which follows ISO 4217’s minor-unit column) for every listed currency', () => {
    for (const code of CURRENCY_CODES) {
      const digits = new Intl.NumberFormat('en', { style: 'currency', currency: code }).resolvedOptions().maximumFractionDigits;
      expect(digits, code).toBe(CURRENCIES[code].exponent);
    }
  });
});

describe('minor units ↔ text', () => {
  it('converts without floating point: 0.29 stays 29 cents, 1.005 is refused, yen have no decimals', () => {
    expect(decimalTextToMinor('0.29', 'USD')).toBe(29);
    expect(decimalTextToMinor('45', 'USD')).toBe(4500);
    expect(decimalTextToMinor('45.5', 'EUR')).toBe(4550);
    expect(decimalTextToMinor('45,50', 'EUR')).toBe(4550);
    expect(decimalTextToMinor('1.005', 'USD')).toBeNull();
    expect(decimalTextToMinor('4500', 'JPY')).toBe(4500);
    expect(decimalTextToMinor('45.5', 'JPY')).toBeNull();
    expect(decimalTextToMinor('-5', 'USD')).toBeNull();
    expect(decimalTextToMinor('1,200.00', 'USD')).toBeNull();
    expect(minorToDecimalText(4500, 'USD')).toBe('45.00');
    expect(minorToDecimalText(5, 'USD')).toBe('0.05');
    expect(minorToDecimalText(4500, 'JPY')).toBe('4500');
    for (let cents = 0; cents < 2000; cents += 7) expect(decimalTextToMinor(minorToDecimalText(cents, 'GBP'), 'GBP')).toBe(cents);
  });

  it('formats with Intl.NumberFormat in the viewer’s locale', () => {
    expect(formatMoney(4500, 'USD', 'en-US')).toBe('$45.00');
    expect(formatMoney(4500, 'JPY', 'en-US')).toBe('¥4,500');
    expect(formatMoney(4550, 'EUR', 'de-DE')).toMatch(/^45,50\s€$/);
  });
});

describe('FeeInputSchema', () => {
  it('accepts the limits exactly and refuses one unit beyond', () => {
    const { min_minor, max_minor } = CURRENCIES.USD;
    expect(FeeInputSchema.safeParse({ kind: 'monthly', amount_minor: min_minor, currency: 'USD' }).success).toBe(true);
    expect(FeeInputSchema.safeParse({ kind: 'monthly', amount_minor: max_minor, currency: 'USD' }).success).toBe(true);
    expect(FeeInputSchema.safeParse({ kind: 'monthly', amount_minor: min_minor - 1, currency: 'USD' }).success).toBe(false);
    expect(FeeInputSchema.safeParse({ kind: 'monthly', amount_minor: max_minor + 1, currency: 'USD' }).success).toBe(false);
    expect(FeeInputSchema.safeParse({ kind: 'block', amount_minor: 5000, currency: 'USD', block_weeks: 52 }).success).toBe(true);
    expect(FeeInputSchema.safeParse({ kind: 'block', amount_minor: 5000, currency: 'USD', block_weeks: 53 }).success).toBe(false);
    expect(FeeInputSchema.safeParse({ kind: 'monthly', amount_minor: 5000, currency: 'USD', block_weeks: 4 }).success).toBe(
      false,
    );
  });
});

describe('billingStatus', () => {
  const payer = { waived: false, paid_through: '2026-12-31', cancel_at_period_end: false, ended: false };
  it('names each state with our rules', () => {
    expect(billingStatus('none', undefined, '2026-12-05')).toEqual({ status: 'free', overdue_days: 0 });
    expect(billingStatus('monthly', undefined, '2026-12-05')).toEqual({ status: 'due', overdue_days: 0 });
    expect(billingStatus('monthly', payer, '2026-12-31')).toEqual({ status: 'paid', overdue_days: 0 });
    expect(billingStatus('monthly', payer, '2027-01-06')).toEqual({ status: 'overdue', overdue_days: 6 });
    expect(billingStatus('monthly', { ...payer, cancel_at_period_end: true }, '2026-12-05').status).toBe('cancelled');
    expect(billingStatus('monthly', { ...payer, waived: true }, '2027-03-01').status).toBe('waived');
    expect(billingStatus('none', { ...payer, waived: true }, '2027-03-01').status).toBe('waived');
  });

  it('counts calendar days in UTC across month ends and daylight-saving changes', () => {
    expect(daysBetween('2026-03-28', '2026-03-30')).toBe(2);
    expect(daysBetween('2026-12-31', '2027-01-06')).toBe(6);
    expect(addDays('2026-12-05', 12 * 7 - 1)).toBe('2027-02-26');
    // A period ending exactly at midnight covers the day before; one ending during a day covers that day.
    expect(lastDayBefore(Date.UTC(2027, 0, 5) / 1000)).toBe('2027-01-04');
    expect(lastDayBefore(Date.UTC(2027, 0, 5, 4, 57) / 1000)).toBe('2027-01-05');
  });
});
