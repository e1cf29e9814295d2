import { z } from 'zod';
import { RUN_LIST_SORTS, type RunListOrder, type RunListSort } from './schemas.ts';

/**
 * The runs list's keyset cursor (issue 19: deep pages as fast as the first). It names the last run of a page
 * by its place in the order: the sort, the direction, the sort key as PostgreSQL printed it (exact: text of a
 * timestamptz or float8 reads back to the same value) and the run id that breaks ties. Opaque to clients:
 * base64url of a small JSON array, at most RUN_LIST_CURSOR_MAX_LENGTH characters.
 */
export interface RunListCursor {
  sort: RunListSort;
  order: RunListOrder;
  /** The sort key of the last run shown; null only for pace (a run without a pace). */
  key: string | null;
  id: string;
}

export const RUN_LIST_CURSOR_MAX_LENGTH = 300;

/** The sentence a runner reads when a "more runs" address is damaged or from another order. */
export const RUN_LIST_CURSOR_ERROR = 'This link to more runs no longer works. Start again from the first page of your runs.';

const CursorTupleSchema = z.tuple([
  z.literal(1),
  z.enum(RUN_LIST_SORTS),
  z.enum(['asc', 'desc']),
  z.string().max(64).nullable(),
  z.uuid(),
]);

const KEY_PATTERN: Record<RunListSort, RegExp> = {
  // PostgreSQL's own timestamptz text: 2026-11-30 06:00:00.123+00 (any offset).
  date: /^\d{4}-\d{2}-\d{2} \d{2}:\d{2}:\d{2}(\.\d{1,6})?[+-]\d{2}(:\d{2}){0,2}$/,
  distance: /^-?\d+(\.\d+)?(e[+-]?\d+)?$/,
  duration: /^-?\d+(\.\d+)?(e[+-]?\d+)?$/,
  pace: /^-?\d+(\.\d+)?(e[+-]?\d+)?$/,
};

export function encodeRunListCursor(cursor: RunListCursor): string {
  const json = JSON.stringify([1, cursor.sort, cursor.order, cursor.key, cursor.id]);
  return btoa(json).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

/** The cursor, or null when the text is not one this code made (damaged, cut short, edited, too long). */
export function decodeRunListCursor(text: string): RunListCursor | null {
  if (text.length === 0 || text.length > RUN_LIST_CURSOR_MAX_LENGTH || !/^[A-Za-z0-9_-]+$/.test(text)) return null;
  let json: unknown;
  try {
    json = JSON.parse(atob(text.replace(/-/g, '+').replace(/_/g, '/')));
  } catch {
    return null;
  }
  const parsed = CursorTupleSchema.safeParse(json);
  if (!parsed.success) return null;
  const [, sort, order, key, id] = parsed.data;
  if (key === null ? sort !== 'pace' : !KEY_PATTERN[sort].test(key)) return null;
  return { sort, order, key, id };
}
