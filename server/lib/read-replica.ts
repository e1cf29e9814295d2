/**
 * A PostgreSQL streaming read replica for the read-only pages (runs list, run page, week review, squad
 * overview): decisions in server/lib/README.md ("Read replica").
 *
 * - A monitor samples the primary's WAL insert position and the replica's replay position every
 *   `POLL_MS`; the replica is "fresh as of" the newest primary sample it has replayed, and its lag is
 *   the time since then.
 * - Read-your-writes: after a user's successful write the primary's WAL insert position is stored on
 *   their row (`users.last_write_lsn`, read with the user on every request); their reads go to the
 *   replica only once it has replayed past it.
 * - Down, promoted, or lagging past `maxLagMs`: reads go to the primary. A request whose replica reads
 *   fail is run again on the primary, so no request fails because the replica is gone.
 */
import type { RequestHandler, Response } from 'express';
import knexFactory, { type Knex } from 'knex';
import { knexConfig } from '../../db/knexfile.ts';
import type { AppConfig } from '../config.ts';
import type { AuthLocals } from './authorize.ts';
import { AppError } from './errors.ts';
import { db as primaryDb, replicaReadContext } from './db.ts';
import { logger } from './logger.ts';

/** How often the monitor samples both positions (two one-row queries per web process). */
const POLL_MS = 250;
/** A replica that does not answer the monitor within this is taken as down until it does. */
const PROBE_TIMEOUT_MS = 1_000;
/** Unreplayed primary samples kept (about 4 minutes at POLL_MS); older ones only make the lag look larger, never smaller. */
const MAX_SAMPLES = 1_000;
/** Response header naming who served a routed read, outside production (tests and operators read it). */
export const READ_SOURCE_HEADER = 'X-Read-Source';

/** A PostgreSQL LSN ("16/B374D848") as a number that compares correctly. */
export function parseLsn(text: string): bigint {
  const match = /^([0-9A-F]{1,8})\/([0-9A-F]{1,8})$/i.exec(text);
  if (!match) throw new Error(`not a PostgreSQL LSN: ${text}`);
  return (BigInt(`0x${match[1]}`) << 32n) | BigInt(`0x${match[2]}`);
}

/**
 * The insert position as a record end. At the very start of a WAL page the primary reports its insert
 * position just past the page header (24 bytes, 40 at the start of a segment), while a replica that has
 * replayed everything reports the page boundary itself: without this an idle primary would look forever
 * ahead. No record ends right after a header (a page's data starts there), so nothing real is skipped.
 */
export function asRecordEnd(lsn: bigint, walBlockSize: bigint, walSegmentSize: bigint): bigint {
  const inPage = lsn % walBlockSize;
  if (inPage === 40n && lsn % walSegmentSize === 40n) return lsn - 40n;
  if (inPage === 24n && lsn % walSegmentSize !== 24n) return lsn - 24n;
  return lsn;
}

function withTimeout<T>(promise: Promise<T>, ms: number): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error(`no answer within ${ms} ms`)), ms);
  });
  return Promise.race([promise, timeout]).finally(() => clearTimeout(timer));
}

export class ReadReplica {
  readonly knex: Knex;
  /** Routed reads served by each side, and reads retried on the primary after the replica failed. */
  readonly counts = { replica: 0, primary: 0, retried: 0 };
  private samples: Array<{ at: number; lsn: bigint }> = [];
  private replayLsn: bigint | null = null;
  private freshAsOf = 0;
  private up = false;
  private timer: NodeJS.Timeout | null = null;
  private polling: Promise<void> | null = null;
  private stopped = false;
  /** The primary's WAL page and segment sizes (8 KiB and 16 MiB unless initdb chose others), read at start. */
  private wal = { block: 8192n, segment: 16n * 1024n * 1024n };

  constructor(
    url: string,
    readonly maxLagMs: number,
    readonly showsSource: boolean,
  ) {
    const base = knexConfig(url);
    this.knex = knexFactory({
      ...base,
      // Fail fast: a replica that does not answer sends the request to the primary instead of making it wait.
      connection: { connectionString: url, connectionTimeoutMillis: 1_000, query_timeout: 10_000 },
      acquireConnectionTimeout: 2_000,
      log: {
        warn: (message: unknown) => logger.warn({ knex: message }, 'read replica driver warning'),
        error: (message: unknown) => logger.warn({ knex: message }, 'read replica driver error'),
      },
    });
  }

  /** Starts the monitor; resolves after its first sample (the replica serves nothing before). */
  async start(): Promise<void> {
    try {
      const { rows } = await primaryDb.raw<{ rows: Array<{ name: string; setting: string }> }>(
        "select name, setting from pg_settings where name in ('wal_block_size', 'wal_segment_size')",
      );
      for (const r of rows) this.wal[r.name === 'wal_block_size' ? 'block' : 'segment'] = BigInt(r.setting);
    } catch (err) {
      logger.warn({ err }, 'reading the WAL sizes failed; assuming the defaults');
    }
    await this.poll();
    const tick = () => {
      if (this.stopped) return;
      this.polling = this.poll().finally(() => {
        this.polling = null;
        if (!this.stopped) this.timer = setTimeout(tick, POLL_MS).unref();
      });
    };
    this.timer = setTimeout(tick, POLL_MS).unref();
  }

  async stop(): Promise<void> {
    this.stopped = true;
    if (this.timer) clearTimeout(this.timer);
    await this.polling;
    await this.knex.destroy();
  }

  /** Milliseconds since the newest moment as of which the replica had replayed everything the primary had written. */
  lagMs(now = Date.now()): number {
    return now - this.freshAsOf;
  }

  /** Whether a reader whose last write ended at `lastWriteLsn` (null: none recorded) may be served by the replica now. */
  serves(lastWriteLsn: string | null): boolean {
    if (!this.up || this.replayLsn === null || this.lagMs() > this.maxLagMs) return false;
    return lastWriteLsn === null || this.recordEnd(lastWriteLsn) <= this.replayLsn;
  }

  /** A read on the replica failed with something other than an answer of ours: take it as down until the monitor sees it. */
  markDown(err: unknown): void {
    if (this.up) logger.warn({ err }, 'read replica failed a read; reads go to the primary until it answers again');
    this.up = false;
  }

  /** Stores the primary's WAL insert position on the user's row, after their write committed. */
  async recordWrite(userId: string): Promise<void> {
    // The insert position, not pg_current_wal_lsn(): with synchronous_commit off the commit record of the
    // user's write may not be written out yet, and the insert position is past it either way.
    await primaryDb.raw('update users set last_write_lsn = greatest(last_write_lsn, pg_current_wal_insert_lsn()) where id = ?', [
      userId,
    ]);
  }

  private async poll(): Promise<void> {
    const at = Date.now();
    let primaryLsn: bigint;
    try {
      const { rows } = await primaryDb.raw<{ rows: Array<{ lsn: string }> }>('select pg_current_wal_insert_lsn()::text as lsn');
      primaryLsn = this.recordEnd(rows[0]!.lsn);
    } catch {
      return; // the primary is away: requests answer 503 on their own, nothing to decide here
    }
    this.samples.push({ at, lsn: primaryLsn });
    try {
      const { rows } = await withTimeout(
        this.knex.raw<{ rows: Array<{ standby: boolean; lsn: string | null }> }>(
          'select pg_is_in_recovery() as standby, pg_last_wal_replay_lsn()::text as lsn',
        ),
        PROBE_TIMEOUT_MS,
      );
      const row = rows[0]!;
      // Promoted (or never a standby): it no longer follows this primary.
      if (!row.standby || !row.lsn) return this.setUp(false, 'the read replica is not a standby; reads go to the primary');
      const replay = parseLsn(row.lsn);
      this.replayLsn = replay;
      let fresh = this.freshAsOf;
      this.samples = this.samples.filter((s) => {
        if (s.lsn > replay) return true;
        fresh = Math.max(fresh, s.at);
        return false;
      });
      if (this.samples.length > MAX_SAMPLES) this.samples.splice(0, this.samples.length - MAX_SAMPLES);
      this.freshAsOf = fresh;
      this.setUp(true, 'read replica answers; it serves reads while within its lag bound');
    } catch (err) {
      this.setUp(false, 'read replica does not answer; reads go to the primary', err);
    }
  }

  private recordEnd(lsn: string): bigint {
    return asRecordEnd(parseLsn(lsn), this.wal.block, this.wal.segment);
  }

  private setUp(up: boolean, message: string, err?: unknown): void {
    if (up !== this.up) (up ? logger.info : logger.warn).call(logger, { err }, message);
    this.up = up;
  }
}

let current: ReadReplica | null = null;

/** Starts routing reads to `config.replica` (nothing when it is not set). One per process. */
export async function startReadReplica(config: AppConfig): Promise<ReadReplica | null> {
  if (!config.replica) return null;
  const replica = new ReadReplica(config.replica.url, config.replica.maxLagMs, config.env !== 'production');
  await replica.start();
  current = replica;
  return replica;
}

export async function stopReadReplica(): Promise<void> {
  const replica = current;
  current = null;
  await replica?.stop();
}

function showSource(res: Response, replica: ReadReplica, source: 'replica' | 'primary'): void {
  if (replica.showsSource && !res.headersSent) res.setHeader(READ_SOURCE_HEADER, source);
}

/**
 * Runs a read-only route's handler with `readDb()` on the replica when it may serve this reader, else
 * on the primary. If the handler fails on the replica before answering, it runs again on the primary:
 * a replica that went away, a recovery conflict or a row not replayed yet never fails the request.
 */
export function replicaReads(handler: RequestHandler): RequestHandler {
  return async (req, res, next) => {
    const replica = current;
    if (!replica) return handler(req, res, next);
    const { actor } = res.locals as AuthLocals;
    if (!replica.serves(actor?.last_write_lsn ?? null)) {
      replica.counts.primary++;
      showSource(res, replica, 'primary');
      return handler(req, res, next);
    }
    showSource(res, replica, 'replica');
    try {
      await replicaReadContext.run(replica.knex, () => handler(req, res, next));
      replica.counts.replica++;
    } catch (err) {
      if (res.headersSent) throw err;
      // Our own answers (404 for a row the replica has not replayed yet) do not mean the replica is down.
      if (!(err instanceof AppError)) replica.markDown(err);
      replica.counts.retried++;
      showSource(res, replica, 'primary');
      await handler(req, res, next);
    }
  };
}

const WRITE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/**
 * After a signed-in user's successful write, records the primary's WAL position on their row before the
 * answer leaves, so their next request (to any web process) reads from the primary until the replica
 * has replayed it. Installed after `authenticate`; does nothing without a replica.
 */
export function rememberWritePositions(): RequestHandler {
  return (req, res, next) => {
    const replica = current;
    const { actor } = res.locals as AuthLocals;
    if (!replica || !actor || !WRITE_METHODS.has(req.method)) return next();
    const end = res.end;
    let recording = false;
    res.end = function (this: Response, ...args: unknown[]) {
      if (recording || res.statusCode >= 400) return (end as (...a: unknown[]) => Response).apply(this, args);
      recording = true;
      replica
        .recordWrite(actor.id)
        .catch((err: unknown) => logger.warn({ err }, 'recording a write position failed'))
        .finally(() => (end as (...a: unknown[]) => Response).apply(this, args));
      return this;
    } as Response['end'];
    next();
  };
}
