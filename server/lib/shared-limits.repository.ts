import { db } from './db.ts';

/**
 * The counts behind every request limiter, in PostgreSQL so that any number of web processes on one
 * database enforce one limit (README.md, "Shared limits"). Times are the database's clock (`now()`),
 * never a process's, so machines whose clocks differ still agree on a window.
 */

export interface Hits {
  hits: number;
  resetAt: Date;
}

type HitsRow = { hits: number; reset_at: Date };
const toHits = (row: HitsRow): Hits => ({ hits: Number(row.hits), resetAt: new Date(row.reset_at) });

/**
 * Counts one request against `key` in a fixed window of `windowMs` that starts at the key's first
 * request (express-rate-limit's own memory store counts the same way). One statement: concurrent
 * requests from several processes queue on the row and each sees the count after its own.
 */
export async function countHit(key: string, windowMs: number): Promise<Hits> {
  const { rows } = await db.raw<{ rows: HitsRow[] }>(
    `insert into rate_limit_hits as h (key, hits, reset_at)
     values (?, 1, now() + ? * interval '1 millisecond')
     on conflict (key) do update set
       hits = case when h.reset_at <= now() then 1 else h.hits + 1 end,
       reset_at = case when h.reset_at <= now() then excluded.reset_at else h.reset_at end
     returning hits, reset_at`,
    [key, windowMs],
  );
  return toHits(rows[0]!);
}

/** Takes one request back (a limiter told to skip it after the fact). */
export async function uncountHit(key: string): Promise<void> {
  await db('rate_limit_hits')
    .where({ key })
    .andWhere('reset_at', '>', db.fn.now())
    .update({ hits: db.raw('greatest(hits - 1, 0)') });
}

/** The key's count in its current window; undefined when it has none. */
export async function hitsOf(key: string): Promise<Hits | undefined> {
  const row = (await db('rate_limit_hits').where({ key }).andWhere('reset_at', '>', db.fn.now()).first('hits', 'reset_at')) as
    HitsRow | undefined;
  return row ? toHits(row) : undefined;
}

export async function forgetHits(key: string): Promise<void> {
  await db('rate_limit_hits').where({ key }).delete();
}

export async function forgetHitsStartingWith(prefix: string): Promise<void> {
  await db('rate_limit_hits')
    .whereLike('key', `${prefix.replace(/[\\%_]/g, '\\$&')}%`)
    .delete();
}

/**
 * Leases an upload slot of `kind` for the user when fewer than `max` are held; otherwise says how
 * many are held. Claims for one user and kind take turns on a transaction-scoped advisory lock, so
 * two processes letting in an upload at the same instant cannot both see the last free slot.
 */
export async function claimUploadSlot(
  kind: string,
  userId: string,
  max: number,
  leaseMs: number,
): Promise<{ id: string } | { held: number }> {
  return db.transaction(async (trx) => {
    await trx.raw("select pg_advisory_xact_lock(hashtextextended('pacewright-upload-slots:' || ? || ':' || ?, 0))", [
      kind,
      userId,
    ]);
    const counted = (await trx('upload_slots')
      .where({ kind, user_id: userId })
      .andWhere('expires_at', '>', trx.fn.now())
      .count({ n: '*' })
      .first()) as { n: string | number } | undefined;
    const held = Number(counted?.n ?? 0);
    if (held >= max) return { held };
    const [row] = (await trx('upload_slots')
      .insert({ kind, user_id: userId, expires_at: trx.raw("now() + ? * interval '1 millisecond'", [leaseMs]) })
      .returning('id')) as Array<{ id: string }>;
    return { id: row!.id };
  });
}

/** Extends a slot's lease; false when the slot is gone (its lease ran out and it was swept). */
export async function renewUploadSlot(id: string, leaseMs: number): Promise<boolean> {
  const renewed = await db('upload_slots')
    .where({ id })
    .update({ expires_at: db.raw("now() + ? * interval '1 millisecond'", [leaseMs]) });
  return renewed > 0;
}

export async function releaseUploadSlot(id: string): Promise<void> {
  await db('upload_slots').where({ id }).delete();
}

/** How many upload slots of any kind the user holds now (tests and the operator's queries). */
export async function uploadSlotsHeldBy(userId: string): Promise<number> {
  const counted = (await db('upload_slots')
    .where({ user_id: userId })
    .andWhere('expires_at', '>', db.fn.now())
    .count({ n: '*' })
    .first()) as { n: string | number } | undefined;
  return Number(counted?.n ?? 0);
}

/** Deletes windows that have ended and leases that have run out: rows nobody counts any more. */
export async function sweepEndedLimits(): Promise<{ hits: number; slots: number }> {
  const hits = await db('rate_limit_hits').where('reset_at', '<=', db.fn.now()).delete();
  const slots = await db('upload_slots').where('expires_at', '<=', db.fn.now()).delete();
  return { hits, slots };
}
