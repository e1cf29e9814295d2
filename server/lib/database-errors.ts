import { AppError } from './errors.ts';

/**
 * Errors that mean "the database cannot be reached just now" (stopped, restarting, unreachable, or
 * every connection busy) rather than "this request is wrong". The error handler answers them 503
 * with Retry-After instead of 500; the import worker waits for the database instead of failing.
 */

/** SQLSTATEs of a server that is shutting down, crashed, starting up or out of connections (PostgreSQL, Appendix A). */
const UNAVAILABLE_SQLSTATES = new Set(['57P01', '57P02', '57P03', '53300']);
/** SQLSTATE class 08, "connection exception": the connection itself failed. */
const CONNECTION_EXCEPTION_CLASS = '08';
/** Node socket errors when the server cannot be reached or the link drops. */
const NETWORK_ERROR_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ECONNABORTED',
  'ETIMEDOUT',
  'EPIPE',
  'EHOSTUNREACH',
  'EHOSTDOWN',
  'ENETUNREACH',
  'ENOTFOUND',
  'EAI_AGAIN',
]);
/**
 * node-postgres, pg-pool and Knex report these in words only, without a code. Knex puts the SQL in
 * front ("select 1 - Connection terminated unexpectedly"), so each is matched at the end.
 */
const UNAVAILABLE_MESSAGES = [
  /Connection terminated unexpectedly$/,
  /Connection terminated due to connection timeout$/,
  /Connection ended unexpectedly$/,
  /(?:^| - )timeout expired$/,
  /Client has encountered a connection error and is not queryable$/,
  /Client was closed and is not queryable$/,
  /^Knex: Timeout acquiring a connection\./,
];
/** Wrapped errors (`cause`, Node's AggregateError from trying several addresses) are looked into this deep. */
const MAX_DEPTH = 3;

/** True when `err` says the database is out of reach, as opposed to a mistake in a query or in the request. */
export function isDatabaseUnavailable(err: unknown, depth = 0): boolean {
  if (typeof err !== 'object' || err === null || depth > MAX_DEPTH) return false;
  const { code, message, cause, errors } = err as { code?: unknown; message?: unknown; cause?: unknown; errors?: unknown };
  if (typeof code === 'string') {
    if (UNAVAILABLE_SQLSTATES.has(code) || NETWORK_ERROR_CODES.has(code)) return true;
    if (code.length === 5 && code.startsWith(CONNECTION_EXCEPTION_CLASS)) return true;
  }
  if (typeof message === 'string' && UNAVAILABLE_MESSAGES.some((pattern) => pattern.test(message))) return true;
  if (isDatabaseUnavailable(cause, depth + 1)) return true;
  return Array.isArray(errors) && errors.some((inner) => isDatabaseUnavailable(inner, depth + 1));
}

/** Seconds a client is asked to wait (Retry-After): a restart of PostgreSQL takes a few seconds. */
export const DATABASE_RETRY_AFTER_SECONDS = 30;

export class DatabaseUnavailableError extends AppError {
  constructor() {
    super(
      503,
      'database-unavailable',
      'Pacewright cannot reach its database just now. Please try again in a moment; everything saved before is safe.',
    );
  }
}
