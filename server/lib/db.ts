import { AsyncLocalStorage } from 'node:async_hooks';
import knexFactory, { type Knex } from 'knex';
import pg from 'pg';
import { knexConfig } from '../../db/knexfile.ts';
import { databaseUrlFromEnv } from '../config.ts';
import { logger } from './logger.ts';

// Return numeric columns (weight_kg) as JS numbers; our values are small and never need arbitrary precision.
pg.types.setTypeParser(pg.types.builtins.NUMERIC, (v) => Number(v));
// Dates are calendar days in the runner's time zone: keep them as 'YYYY-MM-DD', never shift them through a JS Date.
pg.types.setTypeParser(pg.types.builtins.DATE, (v) => v);

export interface UserRow {
  id: string;
  email: string;
  password_hash: string;
  name: string;
  role: 'runner' | 'coach' | 'admin';
  unit: 'mi' | 'km';
  birth_year: number | null;
  resting_hr: number | null;
  max_hr: number | null;
  weight_kg: number | null;
  time_zone: string;
  pace_tolerance: number;
  notify_on_import: boolean;
  notify_on_plan_change: boolean;
  notify_on_note: boolean;
  notify_on_pain_alert: boolean;
  notify_on_squad_leave: boolean;
  notify_on_digest: boolean;
  week_starts_on: number;
  sex: 'male' | 'female' | null;
  created_at: Date;
  updated_at: Date;
  /** The primary's WAL insert position after this user's last write (read-your-writes, server/lib/read-replica.ts). */
  last_write_lsn: string | null;
}

export interface ApiTokenRow {
  id: string;
  user_id: string;
  name: string;
  token_hash: string;
  created_at: Date;
  expires_at: Date;
  last_used_at: Date | null;
}

export interface SquadRow {
  id: string;
  coach_id: string;
  name: string;
  created_at: Date;
}

export interface SquadMemberRow {
  squad_id: string;
  runner_id: string;
  joined_at: Date;
}

export interface SourceFileRow {
  id: string;
  user_id: string;
  original_name: string;
  sha256: string;
  size_bytes: string;
  storage_key: string;
  format: string;
  created_at: Date;
}

export interface RunRow {
  id: string;
  user_id: string;
  source_file_id: string;
  activity_index: number;
  name: string;
  sport: string | null;
  /** Run, ride or hike (issue #14); only runs count in running totals and plan checks. */
  activity_kind: 'run' | 'ride' | 'hike';
  started_at: Date;
  ended_at: Date;
  local_date: string;
  local_time: string;
  time_zone: string;
  time_zone_source: 'start position' | 'profile';
  distance_m: number;
  distance_source: 'device' | 'geodesic' | 'none';
  elapsed_s: number;
  moving_s: number;
  ascent_m: number | null;
  descent_m: number | null;
  avg_hr: number | null;
  max_hr: number | null;
  avg_cad: number | null;
  points: number;
  segments: number;
  details: Record<string, unknown>;
  created_at: Date;
}

export interface RunTrackRow {
  run_id: string;
  point_count: number;
  columns: string[];
  data: Buffer;
  /** How the columns lie inside the gzip blob (server/features/runs/track-blob.ts, `TrackLayout`). */
  data_layout: 'columns' | 'xor-planes';
}

export interface RunSplitRow {
  run_id: string;
  unit: 'mi' | 'km';
  split_index: number;
  distance_m: number;
  start_at: Date;
  end_at: Date;
  elapsed_s: number;
  moving_s: number;
  pace_s: number | null;
  flat_pace_s: number | null;
  avg_hr: number | null;
  max_hr: number | null;
  avg_cad: number | null;
  elev_gain_m: number | null;
  elev_loss_m: number | null;
}

export interface RunLapRow {
  run_id: string;
  lap_index: number;
  start_at: Date;
  total_time_s: number | null;
  distance_m: number | null;
  avg_hr: number | null;
  max_hr: number | null;
}

export interface RunFastestSectionRow {
  run_id: string;
  distance_m: number;
  time_s: number;
  pace_s_per_km: number;
  start_at: Date;
  end_at: Date;
  start_distance_m: number;
}

export interface RunNoteRow {
  id: string;
  run_id: string;
  author_id: string;
  text: string;
  created_at: Date;
  concern: NoteConcern | null;
}

export interface GoalRaceRow {
  user_id: string;
  name: string;
  date: string;
  distance_m: number;
  goal_time_s: number;
  updated_at: Date;
}

export interface RaceResultRow {
  id: string;
  user_id: string;
  name: string | null;
  date: string;
  distance_m: number;
  time_s: number;
  created_at: Date;
}

export interface SessionPlanRow {
  id: string;
  runner_id: string;
  author_id: string | null;
  date: string;
  title: string;
  notes: string;
  items: unknown;
  created_at: Date;
  updated_at: Date;
  updated_by: string | null;
  sequence: number;
}

export interface PlanChangeRow {
  id: string;
  plan_id: string;
  runner_id: string;
  actor_id: string | null;
  actor_name: string;
  kind: 'added' | 'changed' | 'moved' | 'deleted';
  summary: string;
  plan_date: string;
  created_at: Date;
  noticed_at: Date | null;
}

export interface LibrarySessionRow {
  id: string;
  owner_id: string;
  name: string;
  title: string;
  notes: string;
  items: unknown;
  fuel_plan: unknown;
  created_at: Date;
  updated_at: Date;
}

export interface PlanBatchRow {
  id: string;
  actor_id: string;
  kind: 'copy-week' | 'assign';
  created_ids: unknown;
  replaced: unknown;
  created_at: Date;
}

export interface DayMarkRow {
  runner_id: string;
  date: string;
  kind: 'rest' | 'ill' | 'injured' | 'cross-training';
  minutes: number | null;
  note: string;
  author_id: string | null;
  updated_at: Date;
}

export interface CalendarFeedRow {
  user_id: string;
  token_hash: string;
  created_at: Date;
}

export interface RunPlanLinkRow {
  run_id: string;
  plan_id: string | null;
  linked_at: Date;
}

/** A stored plan-check result, valid while `inputs_key` matches the check's current inputs. */
export interface PlanCheckResultRow {
  run_id: string;
  inputs_key: string;
  result: unknown;
  computed_at: Date;
}

export interface WeekInputCounterRow {
  runner_id: string;
  counter: string;
}

export interface AssembledWeekRow {
  runner_id: string;
  week_start: string;
  variant: string;
  counter: string;
  code_version: string;
  today: string;
  body: unknown;
  computed_at: Date;
}

export interface DevOutboxRow {
  id: string;
  to: string;
  subject: string;
  text: string;
  html: string;
  /** Lower-case header names to their unfolded values. */
  headers: Record<string, string>;
  sent_at: Date;
}

export interface NoticeRow {
  id: string;
  recipient_id: string;
  kind: 'import' | 'note' | 'pain_alert' | 'squad_leave';
  batch_key: string;
  payload: Record<string, unknown>;
  created_at: Date;
  sent_at: Date | null;
  outcome: 'sent' | 'switched-off' | 'nothing-left' | 'failed' | null;
  attempts: number;
  retry_at: Date | null;
}

export interface NoticeSwitchChangeRow {
  user_id: string;
  kind: string;
  changed_at: Date;
}

export interface InvitationRow {
  id: string;
  squad_id: string;
  invited_by: string | null;
  email: string;
  token_hash: string;
  created_at: Date;
  expires_at: Date;
  accepted_at: Date | null;
  accepted_by: string | null;
  revoked_at: Date | null;
}

export interface PasswordResetRow {
  id: string;
  user_id: string;
  token_hash: string;
  expires_at: Date;
  used_at: Date | null;
  created_at: Date;
}

export interface SessionRow {
  id: string;
  user_id: string;
  created_at: Date;
  expires_at: Date;
}

/** A sign-up waiting for its e-mailed link (issue 13 #7); `id` is the user id already answered. */
export interface PendingSignupRow {
  id: string;
  token_hash: string;
  email: string;
  name: string;
  role: 'runner' | 'coach';
  password_hash: string;
  next_path: string | null;
  created_at: Date;
  expires_at: Date;
  used_at: Date | null;
}

/** A "someone tried to sign up with your address" notice, kept only to count e-mails per address. */
export interface SignUpNoticeRow {
  id: string;
  email: string;
  created_at: Date;
}

export interface CredentialFailureRow {
  id: string;
  key: string;
  failed_at: Date;
}

/** Requests counted by one express-rate-limit limiter for one caller, in a fixed window (server/lib/postgres-rate-limit-store.ts). */
export interface RateLimitHitRow {
  key: string;
  hits: number;
  reset_at: Date;
}

/** One upload arriving, leased until `expires_at` and renewed while it arrives (server/lib/upload-slots.ts). */
export interface UploadSlotRow {
  id: string;
  kind: string;
  user_id: string;
  expires_at: Date;
}

export interface WeekNoteRow {
  id: string;
  runner_id: string;
  week_start: string;
  author_id: string;
  text: string;
  created_at: Date;
  concern: NoteConcern | null;
}

/** What a runner may flag a note as being about (the coach is told at once). */
export type NoteConcern = 'pain' | 'illness';

export interface NoteReadRow {
  note_id: string;
  user_id: string;
  read_at: Date;
}

export interface WeekReviewRow {
  runner_id: string;
  week_start: string;
  coach_id: string;
  reviewed_at: Date;
}

export interface FuelItemRow {
  id: string;
  user_id: string;
  name: string;
  serving: string;
  carbohydrate_g: number;
  sodium_mg: number;
  caffeine_mg: number;
  fluid_ml: number;
  created_at: Date;
  updated_at: Date;
}

export interface FuelPlanRow {
  id: string;
  runner_id: string;
  author_id: string | null;
  plan_id: string | null;
  goal_race_user_id: string | null;
  body_mass_kg: number;
  expected_duration_s: number;
  expected_duration_given: boolean;
  easy_pace_s_per_km: number | null;
  start_clock: string | null;
  sweat_l_per_h: number | null;
  targets: unknown;
  intakes: unknown;
  schedule: unknown;
  created_at: Date;
  updated_at: Date;
}

export interface FuelTakenRow {
  run_id: string;
  entries: unknown;
  stomach: number | null;
  energy: number | null;
  notes: string;
  updated_at: Date;
}

export interface RunCheckinRow {
  run_id: string;
  sleep_hours: number | null;
  soreness: number | null;
  mood: number | null;
  walking_minutes: number | null;
  mobility_minutes: number | null;
  cold_water_temp_c: number | null;
  cold_water_minutes: number | null;
  notes: string;
  updated_at: Date;
}

export interface ImportRow {
  id: string;
  user_id: string;
  status: 'queued' | 'running' | 'done' | 'failed';
  archive_name: string;
  total: number;
  done: number;
  imported: number;
  duplicates: number;
  rejected: Array<{ file: string; error: string }>;
  created_at: Date;
  finished_at: Date | null;
  /** Last sign of life of a worker on this import (the lease sweep queues it again when this grows old). */
  heartbeat_at: Date | null;
}

export interface ImportFileRow {
  import_id: string;
  position: number;
  name: string;
  status: 'pending' | 'working' | 'imported' | 'duplicate' | 'rejected';
  claimed_at: Date | null;
  /** The process (`host:pid`) that claimed the file last. */
  claimed_by: string | null;
  /** How often the file was claimed; the lease sweep gives it up after IMPORT_MAX_ATTEMPTS. */
  attempts: number;
  /** Last sign of life of the worker holding the file. */
  heartbeat_at: Date | null;
  result: unknown;
}

export interface SquadFeeRow {
  squad_id: string;
  kind: 'none' | 'monthly' | 'block';
  amount_minor: number | null;
  currency: string | null;
  first_month_discount_minor: number | null;
  block_weeks: number | null;
  updated_by: string | null;
  updated_at: Date;
}

export interface PaymentCustomerRow {
  user_id: string;
  customer_id: string;
  created_at: Date;
}

export interface FeePayerRow {
  squad_id: string;
  runner_id: string;
  subscription_id: string | null;
  paid_through: string | null;
  cancel_at_period_end: boolean;
  ended: boolean;
  waived: boolean;
  subscription_event_at: string | null;
  updated_at: Date;
}

export interface FeeReceiptRow {
  id: string;
  payment_ref: string;
  squad_id: string;
  runner_id: string;
  amount_minor: number;
  currency: string;
  paid_at: Date;
  period_start: string;
  period_end: string;
}

export interface PaymentEventRow {
  event_id: string;
  type: string;
  outcome: string;
  received_at: Date;
}

declare module 'knex/types/tables.js' {
  interface Tables {
    users: UserRow;
    api_tokens: ApiTokenRow;
    squads: SquadRow;
    squad_members: SquadMemberRow;
    source_files: SourceFileRow;
    runs: RunRow;
    run_tracks: RunTrackRow;
    run_splits: RunSplitRow;
    run_laps: RunLapRow;
    run_fastest_sections: RunFastestSectionRow;
    run_notes: RunNoteRow;
    goal_races: GoalRaceRow;
    race_results: RaceResultRow;
    session_plans: SessionPlanRow;
    run_plan_links: RunPlanLinkRow;
    plan_changes: PlanChangeRow;
    library_sessions: LibrarySessionRow;
    plan_batches: PlanBatchRow;
    day_marks: DayMarkRow;
    calendar_feeds: CalendarFeedRow;
    plan_check_results: PlanCheckResultRow;
    dev_outbox: DevOutboxRow;
    week_input_counters: WeekInputCounterRow;
    assembled_weeks: AssembledWeekRow;
    notices: NoticeRow;
    notice_switch_changes: NoticeSwitchChangeRow;
    invitations: InvitationRow;
    password_resets: PasswordResetRow;
    sessions: SessionRow;
    credential_failures: CredentialFailureRow;
    rate_limit_hits: RateLimitHitRow;
    upload_slots: UploadSlotRow;
    pending_signups: PendingSignupRow;
    sign_up_notices: SignUpNoticeRow;
    week_notes: WeekNoteRow;
    week_reviews: WeekReviewRow;
    note_reads: NoteReadRow;
    fuel_items: FuelItemRow;
    fuel_plans: FuelPlanRow;
    fuel_taken: FuelTakenRow;
    run_checkins: RunCheckinRow;
    imports: ImportRow;
    import_files: ImportFileRow;
    squad_fees: SquadFeeRow;
    payment_customers: PaymentCustomerRow;
    fee_payers: FeePayerRow;
    fee_receipts: FeeReceiptRow;
    payment_events: PaymentEventRow;
  }
}

/** The single Knex instance. Only repositories (and scripts) import it. */
export const db: Knex = knexFactory({
  ...knexConfig(databaseUrlFromEnv()),
  // Knex's own warnings (a pooled connection dropped while PostgreSQL restarts) go to our log, not the console.
  log: {
    warn: (message: unknown) => logger.warn({ knex: message }, 'database driver warning'),
    error: (message: unknown) => logger.error({ knex: message }, 'database driver error'),
  },
});

export type Db = Knex | Knex.Transaction;

/**
 * The read replica's Knex while a request the replica may serve runs (server/lib/read-replica.ts sets it);
 * absent otherwise.
 */
export const replicaReadContext = new AsyncLocalStorage<Knex>();

/**
 * Knex for a read that a streaming read replica may serve: the replica inside a request routed to it
 * (`reads: 'replica'` on the route), else the primary. Only for plain reads; writes always use `db`.
 */
export function readDb(): Knex {
  return replicaReadContext.getStore() ?? db;
}

/** A fixed SQL text with Knex's `?` placeholders as PostgreSQL's `$1, $2…` (the statement may hold no other `?`). */
function positionalText(sql: string): string {
  let n = 0;
  return sql.replace(/\?/g, () => `$${++n}`);
}

/**
 * A fixed, named (prepared) statement for the queries every request sends (who is calling, a week's runner): sent
 * straight through a connection of the given Knex's pool, without Knex's query builder and runner, which cost the
 * server's thread more than PostgreSQL spent running the statement (tests/bench/README.md, session 9). The pool,
 * its timeouts and its errors are Knex's own; inside a transaction it goes through the transaction as usual.
 */
export function preparedStatement<Row>(name: string, sql: string) {
  const text = positionalText(sql);
  return async (values: readonly unknown[], on: Db): Promise<Row[]> => {
    if (on.isTransaction) return (await on.raw<{ rows: Row[] }>(sql, values as Knex.RawBinding[]).options({ name })).rows;
    const client = on.client as {
      acquireConnection(): Promise<{ query(config: object): Promise<{ rows: Row[] }> }>;
      releaseConnection(connection: unknown): Promise<void>;
      emit(event: 'query', query: object): void;
    };
    // Knex's own `query` event, as its runner sends it, for whoever listens (tests count a request's queries).
    if (on.listenerCount('query') > 0) client.emit('query', { method: 'raw', sql: text, bindings: values, options: { name } });
    const connection = await client.acquireConnection();
    try {
      return (await connection.query({ name, text, values })).rows;
    } finally {
      // A connection that failed is marked by Knex's own listeners; the pool checks it before lending it again.
      void client.releaseConnection(connection);
    }
  };
}

/**
 * A unit of work across repository calls: a service opens it and hands `trx` to each repository
 * function, so the queries themselves stay in repositories (only they, this file and db/ use Knex).
 */
export function inTransaction<T>(work: (trx: Knex.Transaction) => Promise<T>): Promise<T> {
  return db.transaction(work);
}

/** Closes the pool at shutdown: what a composition root (server/index.ts) needs of the database, without the query builder. */
export function closeDatabase(): Promise<void> {
  return db.destroy();
}

/** PostgreSQL's SQLSTATE for a unique violation. */
export const PG_UNIQUE_VIOLATION = '23505';

export function isUniqueViolation(err: unknown): boolean {
  return typeof err === 'object' && err !== null && (err as { code?: string }).code === PG_UNIQUE_VIOLATION;
}

/** How long the health check waits for `select 1` before it calls the database down. */
const HEALTH_CHECK_TIMEOUT_MS = 1_500;

/** A timer that fires this much later than asked means the event loop was busy, not PostgreSQL. */
const BUSY_LATENESS_MS = 100;
/** Times the health check gives PostgreSQL another `timeoutMs` after the process itself was busy. */
const BUSY_EXTENSIONS = 2;

/**
 * Answers within `timeoutMs` even when PostgreSQL hangs instead of refusing the connection. Only
 * time the process could spend waiting counts: when the timer fires late (the event loop was busy,
 * the answer may be sitting unread in the socket), PostgreSQL gets another `timeoutMs`, so a busy
 * process never reports the database down (issue 13).
 */
export async function isDatabaseUp(timeoutMs = HEALTH_CHECK_TIMEOUT_MS): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const givenUp = new Promise<false>((resolve) => {
    let extensions = 0;
    const arm = () => {
      const due = Date.now() + timeoutMs;
      timer = setTimeout(() => {
        if (Date.now() - due > BUSY_LATENESS_MS && extensions++ < BUSY_EXTENSIONS) arm();
        // One more turn of the loop first: an answer already in the socket is read before giving up.
        else setImmediate(() => resolve(false));
      }, timeoutMs);
    };
    arm();
  });
  try {
    return await Promise.race([
      db.raw('select 1').then(
        () => true,
        () => false,
      ),
      givenUp,
    ]);
  } finally {
    clearTimeout(timer);
  }
}
