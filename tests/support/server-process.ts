import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { waitUntil } from './poll.ts';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

/** One pino log line of a child process. */
export type LogLine = { msg?: string; [field: string]: unknown };

export interface AppProcess {
  role: 'web' | 'worker' | 'all';
  pid: number;
  /** The web address; empty for a worker. */
  url: string;
  child: ChildProcess;
  /** The process's log lines so far. */
  logs: LogLine[];
  stderr(): string;
  /** SIGTERM and wait for the exit (a clean stop: files in hand are finished). */
  stop(): Promise<void>;
}

/**
 * Starts Pacewright as a child process on this layer's test database, as it runs in production:
 * `web` and `all` through `server/index.ts` (ROLE=web / ROLE=all) on a free port, resolving once
 * /api/health answers 200; `worker` through `npm run worker`'s script, resolving once it says its
 * jobs run. `env` adds to (and overrides) the test environment: give every process of one test the
 * same JWT_SECRET and DATA_DIR, as a deployment would.
 */
export async function startAppProcess(role: AppProcess['role'], env: Record<string, string>): Promise<AppProcess> {
  const script = role === 'worker' ? 'server/cli/worker.ts' : 'server/index.ts';
  const child = spawn(process.execPath, ['--import', 'tsx', script], {
    cwd: ROOT,
    env: {
      ...process.env, // DATABASE_URL: this layer's test database
      NODE_ENV: 'test',
      ROLE: role,
      PORT: '0',
      HOST: '127.0.0.1',
      MAIL_CATCHER_PORT: '0',
      SMTP_URL: '',
      STORAGE: 'fs',
      LOG_LEVEL: 'info',
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let pending = '';
  let stderr = '';
  const logs: LogLine[] = [];
  child.stdout!.setEncoding('utf8').on('data', (chunk: string) => {
    const lines = (pending + chunk).split('\n');
    pending = lines.pop()!;
    for (const line of lines) {
      try {
        logs.push(JSON.parse(line) as LogLine);
      } catch {
        // not a log line
      }
    }
  });
  child.stderr!.setEncoding('utf8').on('data', (chunk: string) => (stderr += chunk));
  const stop = async () => {
    if (child.exitCode !== null || child.signalCode !== null) return;
    const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
    child.kill('SIGTERM');
    await exited;
  };
  const alive = () => {
    if (child.exitCode !== null) throw new Error(`the ${role} process exited with code ${child.exitCode}:\n${stderr}`);
  };
  try {
    // A cold `tsx` start compiles the whole server: tens of seconds on a loaded 2-core machine.
    const ready = await waitUntil(
      () => {
        alive();
        return logs.find(
          (l) => l.msg?.startsWith('Pacewright is listening on ') || l.msg?.startsWith('Pacewright worker is running'),
        );
      },
      `the ${role} process to start`,
      120_000,
    );
    const url = role === 'worker' ? '' : ready.msg!.slice('Pacewright is listening on '.length);
    if (url) {
      await waitUntil(async () => {
        alive();
        return (await fetch(`${url}/api/health`).catch(() => null))?.status === 200;
      }, `the ${role} process to answer /api/health`);
    }
    return { role, pid: child.pid!, url, child, logs, stderr: () => stderr, stop };
  } catch (err) {
    child.kill('SIGKILL');
    throw err;
  }
}

export type ServerProcess = AppProcess;

/**
 * The real server (`server/index.ts`, compute pool, import worker and all: ROLE=all) as a child
 * process on this layer's test database and a free port; resolves once /api/health says 200.
 */
export function startServerProcess(env: Record<string, string>): Promise<ServerProcess> {
  return startAppProcess('all', { JWT_SECRET: 'big-upload-test-secret-0123456789abcdef', BCRYPT_COST: '10', ...env });
}

/** A bearer token for `email` from the server at `url`. */
export async function bearerFor(url: string, email: string, password: string): Promise<string> {
  const res = await fetch(`${url}/api/auth/token`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  if (res.status !== 200) throw new Error(`token request failed: ${res.status} ${await res.text()}`);
  return `Bearer ${((await res.json()) as { token: string }).token}`;
}
