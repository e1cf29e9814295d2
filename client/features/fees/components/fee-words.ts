import { formatMoney } from '../../../../shared/fees/currencies.ts';
import type { BillingStatus, Fee } from '../../../../shared/fees/schemas.ts';

/** "31 Dec 2026" for a calendar date (YYYY-MM-DD), in the viewer's locale; read as UTC so it never shifts a day. */
export function formatDay(date: string): string {
  return new Intl.DateTimeFormat(undefined, { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' }).format(
    Date.parse(`${date}T00:00:00Z`),
  );
}

/** "$45.00 a month (first month $35.00)", "£90.00 once, for a 12-week block", "No fee". */
export function describeFee(fee: Fee): string {
  if (fee.kind === 'none' || fee.amount_minor === null || !fee.currency) return 'No fee';
  const amount = formatMoney(fee.amount_minor, fee.currency);
  if (fee.kind === 'block') return `${amount} once, for a ${fee.block_weeks}-week block`;
  const first = fee.first_month_discount_minor
    ? ` (first month ${formatMoney(fee.amount_minor - fee.first_month_discount_minor, fee.currency)})`
    : '';
  return `${amount} a month${first}`;
}

/** The status in words: "paid through 31 Dec 2026", "overdue 6 days", "cancelled at period end"… */
export function statusWords(s: {
  status: BillingStatus;
  paid_through: string | null;
  overdue_days: number;
  cancel_at_period_end: boolean;
}): string {
  switch (s.status) {
    case 'paid':
      return s.paid_through ? `paid through ${formatDay(s.paid_through)}` : 'paid';
    case 'overdue':
      return `overdue ${s.overdue_days} ${s.overdue_days === 1 ? 'day' : 'days'}`;
    case 'cancelled':
      return s.cancel_at_period_end && s.paid_through
        ? `cancelled at period end (paid through ${formatDay(s.paid_through)})`
        : 'cancelled';
    default:
      return s.status;
  }
}
