import type { BillingStatus, FeeKind } from './schemas.ts';

export interface PayerState {
  waived: boolean;
  /** Last calendar day paid for (YYYY-MM-DD), null before the first payment. */
  paid_through: string | null;
  cancel_at_period_end: boolean;
  /** The subscription has ended for good (cancelled and its period over, or stopped by the service). */
  ended: boolean;
}

const DAY_MS = 86_400_000;

/** Whole days from `from` to `to`, both YYYY-MM-DD (UTC calendar days, so no daylight-saving hour creeps in). */
export function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / DAY_MS);
}

/**
 * One runner's status in a squad on `today` (YYYY-MM-DD, UTC):
 * waived beats everything; a squad without a fee is free; a cancellation shows as cancelled (the paid period still
 * runs to `paid_through`); paid while today ≤ paid_through; overdue (with the days since) once that date has passed;
 * due before the first payment. Our rules; overdue never locks anyone out of their data (the coach decides).
 */
export function billingStatus(
  kind: FeeKind,
  payer: PayerState | undefined,
  today: string,
): { status: BillingStatus; overdue_days: number } {
  if (payer?.waived) return { status: 'waived', overdue_days: 0 };
  if (kind === 'none') return { status: 'free', overdue_days: 0 };
  if (payer?.cancel_at_period_end || payer?.ended) return { status: 'cancelled', overdue_days: 0 };
  if (!payer?.paid_through) return { status: 'due', overdue_days: 0 };
  const late = daysBetween(payer.paid_through, today);
  return late <= 0 ? { status: 'paid', overdue_days: 0 } : { status: 'overdue', overdue_days: late };
}

/** Unix seconds → YYYY-MM-DD (UTC) of the last day a period ending at that instant covers. */
export function lastDayBefore(periodEndUnix: number): string {
  return new Date(periodEndUnix * 1000 - 1).toISOString().slice(0, 10);
}

/** YYYY-MM-DD plus `days`. */
export function addDays(date: string, days: number): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
}
