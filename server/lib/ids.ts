import { NotFoundError } from './errors.ts';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A path id. Anything that is not a well-formed id is simply not found (never a 400 or a database error). */
export function parseIdParam(value: string | string[] | undefined): string {
  if (typeof value !== 'string' || !UUID.test(value)) throw new NotFoundError();
  return value.toLowerCase();
}

/** A path token (an e-mailed or calendar link's secret): the text as given; the service decides whether it names anything. */
export function readTokenParam(value: string | string[] | undefined): string {
  return typeof value === 'string' ? value : '';
}
