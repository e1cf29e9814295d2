import { randomBytes } from 'node:crypto';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import { MAX_ARCHIVE_UPLOAD_BYTES } from '../shared/history/archive-rules.ts';

/**
 * What a process does (README "Scaling out"): `all` serves HTTP and runs the background jobs (one
 * process, the default); `web` serves HTTP only; `worker` runs the jobs only (`npm run worker`).
 */
export type ProcessRole = 'all' | 'web' | 'worker';
export const PROCESS_ROLES: readonly ProcessRole[] = ['all', 'web', 'worker'];

export interface AppConfig {
  env: 'production' | 'development' | 'test';
  /** ROLE: whether this process serves HTTP, runs the background jobs, or both. */
  role: ProcessRole;
  port: number;
  host: string;
  databaseUrl: string;
  /**
   * A streaming read replica (DATABASE_REPLICA_URL) for the read-only pages, or null; server/lib/read-replica.ts.
   * `maxLagMs` (DATABASE_REPLICA_MAX_LAG_MS): past this lag every read goes to the primary.
   */
  replica: { url: string; maxLagMs: number } | null;
  dataDir: string;
  jwtSecret: string;
  sessionDays: number;
  apiTokenDays: number;
  bcryptCost: number;
  /**
   * Per address and window: failed password checks (credential-limiter.ts), and sign-ups and
   * reset requests (every one); raised in tests.
   */
  authRateLimit: { windowMs: number; max: number };
  /** Failed password checks per account in the same window. */
  credentialFailuresPerAccount: number;
  jsonLimit: string;
  /** Largest single uploaded watch file; a 100-mile run recorded every second is about 25 MB of GPX. */
  uploadMaxFileBytes: number;
  /** Largest bulk-import .zip (MAX_ARCHIVE_UPLOAD_BYTES); lowered in tests to prove the 413. */
  uploadMaxArchiveBytes: number;
  /** All files of one upload request together, bytes (server/features/runs/README.md). */
  uploadMaxRequestBytes: number;
  /** Uploads (single files or archives) one user may have arriving at the same time. */
  uploadsAtOncePerUser: number;
  /**
   * How long an upload's slot is leased (renewed every third of it while the upload arrives): the
   * longest a process that dies mid-upload keeps its slots (server/lib/README.md, "Shared limits").
   */
  uploadSlotLeaseMs: number;
  /** Upload requests per user per window. */
  uploadRateLimit: { windowMs: number; max: number };
  /** Pace-tolerance changes (each makes every plan check recompute) per user per window. */
  recomputeRateLimit: { windowMs: number; max: number };
  /** Original files one user may keep, bytes (STORAGE_QUOTA_MB). */
  storageQuotaBytes: number;
  /** Worker threads for parsing, analysis and plan checks (COMPUTE_THREADS). */
  computeThreads: number;
  /** Nice values the compute threads run below the event loop, 0–19 (COMPUTE_NICE; 0 = as urgent). */
  computeNice: number;
  publicUrl: string;
  /** Outgoing mail server; unset = the local mail catcher on loopback (development). */
  smtpUrl: string | null;
  mailCatcherPort: number;
  mailFrom: string;
  /** Stored files without rows are removed by the orphan sweeper only when older than this (ORPHAN_GRACE_SECONDS). */
  orphanGraceSeconds: number;
  /**
   * Bulk-import leases (server/features/history/README.md): work not beaten for `leaseSeconds`
   * (IMPORT_LEASE_SECONDS, 60) is queued again; a file is given up after `maxAttempts` claims (IMPORT_MAX_ATTEMPTS, 3).
   */
  importLease: { leaseSeconds: number; maxAttempts: number };
  /**
   * When job-running processes send the weekly digests (DIGEST_SCHEDULE, a cron text read in UTC; default
   * `0 6 * * 1`, Monday 06:00); null when set to `off` (server/features/jobs/README.md).
   */
  digestSchedule: string | null;
  /**
   * The payment service (coach fees, server/features/fees/README.md). `url` null means the real service when a
   * secret key is set in production; outside production `startServer` starts the local fake and puts its address
   * here. `webhookSecret` signs and checks webhook events.
   */
  payments: { url: string | null; secretKey: string | null; webhookSecret: string; fakePort: number };
}

/** `DATABASE_URL`, else the embedded cluster on loopback (db/pg.sh). */
export function databaseUrlFromEnv(env: NodeJS.ProcessEnv = process.env): string {
  return env.DATABASE_URL ?? `postgres://postgres@127.0.0.1:${env.PGPORT ?? 54329}/pacewright`;
}

/** COMPUTE_THREADS, else one thread fewer than the cores (the event loop keeps one), between 1 and 4. */
export function defaultComputeThreads(env: NodeJS.ProcessEnv = process.env): number {
  const configured = Number(env.COMPUTE_THREADS);
  if (Number.isInteger(configured) && configured >= 1) return Math.min(configured, 16);
  return Math.max(1, Math.min(4, availableParallelism() - 1));
}

/**
 * Nice value of the compute threads unless COMPUTE_NICE says otherwise: imports and plan checks yield the cores
 * to the event loop that answers reads (measured: tests/bench/README.md, "Session 10: reads before imports").
 */
export const DEFAULT_COMPUTE_NICE = 5;

/** COMPUTE_NICE: a whole number 0–19 of nice values below the event loop (0 = the compute threads as urgent as reads). */
export function readComputeNice(text: string | undefined): number {
  const value = text ?? '';
  if (value === '') return DEFAULT_COMPUTE_NICE;
  if (!/^\d+$/.test(value) || Number(value) > 19) {
    throw new ConfigError(
      `COMPUTE_NICE must be a whole number from 0 (the compute threads as urgent as reads) to 19 (least urgent), not "${value}".`,
    );
  }
  return Number(value);
}

/** How far behind the primary (in time) the read replica may be and still serve reads: 2 s. */
export const DEFAULT_REPLICA_MAX_LAG_MS = 2_000;

const WEAK_SECRETS = new Set(['', 'secret', 'changeme', 'change-me', 'dev', 'development']);

export class ConfigError extends Error {}

/** Monday 06:00 UTC: the digest of the week just ended is in the coach's inbox before the new one starts. */
export const DEFAULT_DIGEST_SCHEDULE = '0 6 * * 1';

/**
 * DIGEST_SCHEDULE: `off`, or a cron text of five fields (minute hour day-of-month month day-of-week) in UTC. Its
 * shape is checked here; pg-boss checks the values when the schedule is set (server/features/weeks/digest-job.ts).
 */
export function readDigestSchedule(text: string | undefined): string | null {
  const value = (text ?? '').trim() || DEFAULT_DIGEST_SCHEDULE;
  if (value.toLowerCase() === 'off') return null;
  const fields = value.split(/\s+/);
  if (value.length > 100 || fields.length !== 5 || !fields.every((f) => /^[\w*/,?-]+$/.test(f))) {
    throw new ConfigError(
      `DIGEST_SCHEDULE must be "off" or a cron text of five fields in UTC (minute hour day month weekday), e.g. "${DEFAULT_DIGEST_SCHEDULE}" for Monday 06:00; not "${value}".`,
    );
  }
  return fields.join(' ');
}

/** Reads configuration from the environment. In production a real JWT_SECRET is mandatory. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const mode = env.NODE_ENV === 'production' ? 'production' : env.NODE_ENV === 'test' ? 'test' : 'development';
  const secret = env.JWT_SECRET ?? '';
  if (mode === 'production' && (WEAK_SECRETS.has(secret.toLowerCase()) || secret.length < 32)) {
    throw new ConfigError(
      'JWT_SECRET must be set to a random string of at least 32 characters when NODE_ENV=production (e.g. `openssl rand -hex 32`).',
    );
  }
  const orphanGrace = env.ORPHAN_GRACE_SECONDS || '600';
  if (!/^\d+$/.test(orphanGrace)) {
    throw new ConfigError(`ORPHAN_GRACE_SECONDS must be a whole number of seconds (0 or more), not "${orphanGrace}".`);
  }
  const leaseSeconds = env.IMPORT_LEASE_SECONDS || '60';
  if (!/^\d+$/.test(leaseSeconds) || Number(leaseSeconds) < 2) {
    throw new ConfigError(`IMPORT_LEASE_SECONDS must be a whole number of seconds (2 or more), not "${leaseSeconds}".`);
  }
  const maxAttempts = env.IMPORT_MAX_ATTEMPTS || '3';
  if (!/^\d+$/.test(maxAttempts) || Number(maxAttempts) < 1) {
    throw new ConfigError(`IMPORT_MAX_ATTEMPTS must be a whole number (1 or more), not "${maxAttempts}".`);
  }
  const quotaMb = env.STORAGE_QUOTA_MB || '1024';
  if (!/^\d+$/.test(quotaMb) || Number(quotaMb) < 1) {
    throw new ConfigError(`STORAGE_QUOTA_MB must be a whole number of megabytes (1 or more), not "${quotaMb}".`);
  }
  const maxLag = env.DATABASE_REPLICA_MAX_LAG_MS || String(DEFAULT_REPLICA_MAX_LAG_MS);
  if (!/^\d+$/.test(maxLag) || Number(maxLag) < 1) {
    throw new ConfigError(`DATABASE_REPLICA_MAX_LAG_MS must be a whole number of milliseconds (1 or more), not "${maxLag}".`);
  }
  const digestSchedule = readDigestSchedule(env.DIGEST_SCHEDULE);
  const computeNice = readComputeNice(env.COMPUTE_NICE);
  const role = (env.ROLE || 'all').toLowerCase();
  if (!(PROCESS_ROLES as readonly string[]).includes(role)) {
    throw new ConfigError(
      `ROLE must be one of ${PROCESS_ROLES.join(', ')} (web: HTTP only, worker: background jobs only), not "${env.ROLE}".`,
    );
  }
  const port = Number(env.PORT ?? 3000);
  const host = env.HOST ?? '127.0.0.1';
  return {
    env: mode,
    role: role as ProcessRole,
    port,
    host,
    databaseUrl: databaseUrlFromEnv(env),
    replica: env.DATABASE_REPLICA_URL ? { url: env.DATABASE_REPLICA_URL, maxLagMs: Number(maxLag) } : null,
    dataDir: path.resolve(env.DATA_DIR ?? '.data'),
    // Outside production a per-process random secret: sessions simply end on restart.
    jwtSecret: secret || randomBytes(32).toString('hex'),
    sessionDays: 14,
    apiTokenDays: 90,
    bcryptCost: Number(env.BCRYPT_COST ?? 12),
    authRateLimit: { windowMs: 15 * 60 * 1000, max: Number(env.AUTH_RATE_LIMIT ?? 20) },
    credentialFailuresPerAccount: 20,
    jsonLimit: '1mb',
    uploadMaxFileBytes: 64 * 1024 * 1024,
    uploadMaxArchiveBytes: MAX_ARCHIVE_UPLOAD_BYTES,
    uploadMaxRequestBytes: 256 * 1024 * 1024,
    uploadsAtOncePerUser: 2,
    uploadSlotLeaseMs: 15_000,
    uploadRateLimit: { windowMs: 10 * 60 * 1000, max: 30 },
    recomputeRateLimit: { windowMs: 60 * 60 * 1000, max: 30 },
    storageQuotaBytes: Number(quotaMb) * 1024 * 1024,
    computeThreads: defaultComputeThreads(env),
    computeNice,
    publicUrl: env.PUBLIC_URL ?? `http://${host}:${port}`,
    smtpUrl: env.SMTP_URL || null,
    mailCatcherPort: Number(env.MAIL_CATCHER_PORT ?? 2525),
    mailFrom: env.MAIL_FROM ?? 'Pacewright <no-reply@pacewright.test>',
    orphanGraceSeconds: Number(orphanGrace),
    importLease: { leaseSeconds: Number(leaseSeconds), maxAttempts: Number(maxAttempts) },
    digestSchedule,
    payments: {
      url: env.PAYMENTS_URL || null,
      secretKey: env.STRIPE_SECRET_KEY || (mode === 'production' ? null : 'sk_test_local_fake'),
      // Outside production a per-process secret shared with the local fake, like the session secret.
      webhookSecret: env.STRIPE_WEBHOOK_SECRET || `whsec_${randomBytes(24).toString('hex')}`,
      fakePort: Number(env.PAYMENTS_FAKE_PORT ?? 0),
    },
  };
}
