import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

export interface ServerProcess {
  url: string;
  pid: number;
  child: ChildProcess;
  /** Everything the server wrote to stderr (a crash would show here). */
  stderr(): string;
  stop(): Promise<void>;
}

/**
 * The real server (`node --import tsx server/index.ts`, compute pool, import worker and all) as a
 * child process on this layer's test database and a free port; resolves once /api/health says 200.
 */
export async function startServerProcess(env: Record<string, string>): Promise<ServerProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: ROOT,
    env: {
      ...process.env, // DATABASE_URL: this layer's test database
      NODE_ENV: 'test',
      PORT: '0',
      HOST: '127.0.0.1',
      JWT_SECRET: 'big-upload-test-secret-0123456789abcdef',
      MAIL_CATCHER_PORT: '0',
      SMTP_URL: '',
      STORAGE: 'fs',
      LOG_LEVEL: 'info',
      BCRYPT_COST: '10',
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let stdout = '';
  let stderr = '';
  child.stderr!.setEncoding('utf8').on('data', (chunk: string) => (stderr += chunk));
  const url = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`the server did not start within 60 s:\n${stderr}`)), 60_000);
    child.stdout!.setEncoding('utf8').on('data', (chunk: string) => {
      stdout += chunk;
      const listening = /listening on (http:\/\/127\.0\.0\.1:\d+)/.exec(stdout);
      if (listening) {
        clearTimeout(timer);
        stdout = '';
        resolve(listening[1]!);
      }
    });
    child.once('exit', (code, signal) => {
      clearTimeout(timer);
      reject(new Error(`the server ended (${code ?? signal}) before it listened:\n${stderr}`));
    });
  });
  for (;;) {
    const res = await fetch(`${url}/api/health`).catch(() => null);
    if (res?.status === 200) break;
    if (child.exitCode !== null) throw new Error(`the server exited with code ${child.exitCode}:\n${stderr}`);
  }
  return {
    url,
    pid: child.pid!,
    child,
    stderr: () => stderr,
    async stop() {
      if (child.exitCode !== null || child.signalCode !== null) return;
      const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
      child.kill('SIGTERM');
      await exited;
    },
  };
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
