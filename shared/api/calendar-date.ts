import { z } from 'zod';

/**
 * Every date the API takes (plans, goals, week reviews and their CSV, the squad overview and digest,
 * day marks, run-list filters) lies in 1900-01-01 … 2100-12-31 (issue 13 #13). Far outside that,
 * date arithmetic in JavaScript and PostgreSQL parted ways (year 0001 or 9999 ended in a 500); no
 * training log needs those days. ISO dates compare correctly as strings.
 */
export const EARLIEST_DATE = '1900-01-01';
export const LATEST_DATE = '2100-12-31';
export const DATE_RANGE_MESSAGE = 'Pick a date between 1 January 1900 and 31 December 2100.';

/** A real calendar date `YYYY-MM-DD` in the range above; `example` shows the form in the error sentence. */
export function calendarDateSchema(example = '2026-11-23') {
  return z.iso
    .date({ error: `Use a date like ${example}.` })
    .refine((date) => date >= EARLIEST_DATE && date <= LATEST_DATE, { error: DATE_RANGE_MESSAGE });
}
