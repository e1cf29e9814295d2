/**
 * The `api-upload` case of `npm run bench` (issue 19: the whole API upload of the 30 h file at most
 * 1.3× the pipeline alone). Runs in its own fresh process, started by import-bench.ts:
 *
 * the app started in this process on 127.0.0.1 against the bench's fresh, migrated database
 * (BENCH_DATABASE_URL, made once per `npm run bench`), a new runner signed up through the API, one
 * warm-up upload of a one-hour file of the same format (a different run) (so the compute thread is started and its hot
 * paths compiled, like the pipeline case's warm-up), then the measured upload: `POST /api/runs` with
 * the file as a multipart part named "files", as a browser sends it (node:http, the body built as a browser
 * builds it, the file read from disk as it is sent), timed from the request's start to the whole answer.
 * The client is its own process (upload-client.ts), as a browser would be. CPU is
 * `process.cpuUsage()` of the server's process (event loop and compute thread); PostgreSQL's own CPU
 * and the client's are not in it.
 *
 * The server side is split where the request's body has fully arrived (`receive_ms`: multipart to
 * disk and to memory, its SHA-256) and the rest (`import_ms`: parse and analysis in the compute thread,
 * rows, one transaction, storing the original, the answer). Before the measured upload the same client
 * sends the same file to a bare server that drops it (`bare_send_ms`): the client and the loopback alone.
 */
import { fork, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer, type IncomingMessage, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { Session } from 'node:inspector/promises';
import path from 'node:path';
import { api } from './json-api.ts';
import type { UploadClientKind, UploadClientReply, UploadClientRequest } from './upload-client.ts';

/** How the client sends (upload-client.ts): node:http with a browser's multipart body, or `BENCH_UPLOAD_CLIENT=fetch`. */
const CLIENT: UploadClientKind = process.env.BENCH_UPLOAD_CLIENT === 'fetch' ? 'fetch' : 'http';

export interface UploadCaseResult {
  status: number;
  imported: number;
  /** Request start → whole answer read, ms. */
  total_ms: number;
  /** Request start → the server saw the last byte of the body. */
  receive_ms: number;
  /** The server saw the last byte → whole answer read. */
  import_ms: number;
  /**
   * The same client sending the same file to a bare node:http server in this process that drops the bytes and
   * answers at once (request start → answer read): what the client and this machine's loopback take alone,
   * the part of `receive_ms` no server work can shorten.
   */
  bare_send_ms: number;
  /** Which client sent it (upload-client.ts). */
  client: UploadClientKind;
  /** process.cpuUsage (user + system) of the server's process during the upload, ms. */
  cpu_ms: number;
  /** The same per thread (Linux, 10 ms ticks): the event loop, the compute thread, libuv's and V8's helpers. */
  cpu_ms_by_thread: Record<string, number>;
  /** Per thread, as above: ms it was ready to run but waited for a core (Linux schedstat; the compute thread runs at nice 5). */
  wait_ms_by_thread: Record<string, number>;
}

/** A new runner (sign-up, the link the mail catcher kept, a bearer token). */
async function signUpRunner(base: string): Promise<string> {
  const email = `bench-${Date.now().toString(36)}-${process.pid}@pacewright.test`;
  const password = `bench-${process.pid}-upload-password`;
  await api(base, 'POST', '/api/auth/register', null, { email, password, name: 'Bench Runner', role: 'runner' });
  let link: string | undefined;
  for (let tries = 0; !link; tries++) {
    if (tries > 300) throw new Error('the sign-up link never reached the mail catcher');
    const { messages } = await api<{ messages: Array<{ to: string; text: string }> }>(base, 'GET', '/api/dev/outbox', null);
    link = messages.find((m) => m.to === email)?.text.match(/\/sign-up\/confirm\/(sgn_[A-Za-z0-9_-]+)/)?.[1];
    if (!link) await new Promise((resolve) => setTimeout(resolve, 50));
  }
  await api(base, 'POST', `/api/auth/register/${link}`, null);
  return (await api<{ token: string }>(base, 'POST', '/api/auth/token', null, { email, password })).token;
}

const now = (): number => performance.timeOrigin + performance.now();

/** When the server last saw the last byte of an upload's body (ms since the epoch), once one has arrived. */
function watchBodyEnds(server: Server): () => number | undefined {
  let last: number | undefined;
  server.prependListener('request', (req: IncomingMessage) => {
    if (req.method !== 'POST' || !req.url?.startsWith('/api/runs')) return;
    req.once('end', () => (last = now()));
  });
  return () => last;
}

/** CPU ms of each thread of this process by thread id (Linux /proc; empty elsewhere), with the thread's name. */
function threadCpu(): Map<string, ThreadTimes> {
  const out = new Map<string, ThreadTimes>();
  if (!existsSync('/proc/self/task')) return out;
  for (const tid of readdirSync('/proc/self/task')) {
    try {
      const stat = readFileSync(`/proc/self/task/${tid}/stat`, 'utf8');
      const name = stat.slice(stat.indexOf('(') + 1, stat.lastIndexOf(')'));
      const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      // utime and stime, fields 14 and 15 of stat(5), in clock ticks (100 per second on Linux).
      // Time runnable but waiting for a core (schedstat's second field, ns; Linux's scheduler statistics).
      const waitNs = existsSync(`/proc/self/task/${tid}/schedstat`)
        ? Number(readFileSync(`/proc/self/task/${tid}/schedstat`, 'utf8').split(' ')[1])
        : 0;
      out.set(tid, { name, ms: (Number(fields[11]) + Number(fields[12])) * 10, waitMs: waitNs / 1e6 });
    } catch {
      // The thread ended meanwhile.
    }
  }
  return out;
}

interface ThreadTimes {
  name: string;
  ms: number;
  waitMs: number;
}

/**
 * CPU ms per thread between two threadCpu() readings, largest first, as "name tid: ms"; and, for the same
 * threads, the ms each was ready to run but waited for a core (a compute thread at nice 5 waits longer
 * than the event loop only when the cores are busy: on a quiet machine this stays near 0).
 */
function threadCpuSince(before: Map<string, ThreadTimes>): { cpu: Record<string, number>; wait: Record<string, number> } {
  const spent: Array<[string, number, number]> = [];
  for (const [tid, now] of threadCpu()) {
    const ms = now.ms - (before.get(tid)?.ms ?? 0);
    const waitMs = Math.round(now.waitMs - (before.get(tid)?.waitMs ?? 0));
    if (ms > 0) spent.push([`${now.name} ${tid}`, ms, waitMs]);
  }
  spent.sort((a, b) => b[1] - a[1]);
  return {
    cpu: Object.fromEntries(spent.map(([key, ms]) => [key, ms])),
    wait: Object.fromEntries(spent.map(([key, , waitMs]) => [key, waitMs])),
  };
}

/**
 * BENCH_PROFILE=<file>: a CPU profile of the server's event loop (not its compute thread) over the
 * measured upload only, for finding where the time beyond the pipeline goes (open it in a browser's
 * developer tools).
 */
async function profileEventLoop(file: string | undefined): Promise<() => Promise<void>> {
  if (!file) return async () => undefined;
  const session = new Session();
  session.connect();
  await session.post('Profiler.enable');
  await session.post('Profiler.start');
  return async () => {
    const { profile } = await session.post('Profiler.stop');
    writeFileSync(file, JSON.stringify(profile));
    session.disconnect();
  };
}

/** The client's upload of `filePath` to a bare server that drops the body and answers 201 once it has all arrived. */
async function bareSend(client: ChildProcess, filePath: string): Promise<number> {
  const bare = createServer((req, res) => {
    req.resume();
    req.once('end', () => res.writeHead(201, { 'content-type': 'application/json' }).end('{"imported":[{}]}'));
  });
  await new Promise<void>((resolve) => bare.listen(0, '127.0.0.1', resolve));
  try {
    const base = `http://127.0.0.1:${(bare.address() as AddressInfo).port}`;
    const answer = await upload(client, { base, token: 'none', path: filePath, name: path.basename(filePath) });
    return Math.round(answer.answered_at - answer.started_at);
  } finally {
    await new Promise((resolve) => bare.close(resolve));
  }
}

/** Has the client process send one file and waits for its answer; anything but 201 with one run is an error. */
function upload(client: ChildProcess, ask: UploadClientRequest): Promise<UploadClientReply> {
  return new Promise((resolve, reject) => {
    const onExit = (code: number | null) => reject(new Error(`the upload client stopped (exit code ${code})`));
    client.once('exit', onExit);
    client.once('message', (reply: UploadClientReply) => {
      client.off('exit', onExit);
      if (reply.status !== 201 || reply.imported !== 1)
        reject(new Error(`upload of ${ask.name}: ${reply.status} ${reply.problem}`));
      else resolve(reply);
    });
    client.send({ ...ask, client: CLIENT });
  });
}

/** Uploads `warmUp` then the file at `filePath` through the running app; see the module comment. */
export async function measureUploadCase(filePath: string, warmUp: Buffer): Promise<UploadCaseResult> {
  const databaseUrl = process.env.BENCH_DATABASE_URL;
  if (!databaseUrl) throw new Error('the api-upload case needs BENCH_DATABASE_URL (import-bench.ts makes it)');
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-bench-data-'));
  Object.assign(process.env, {
    DATABASE_URL: databaseUrl,
    DATA_DIR: dataDir,
    HOST: '127.0.0.1',
    PORT: '0',
    MAIL_CATCHER_PORT: '0',
    LOG_LEVEL: process.env.BENCH_LOG_LEVEL ?? 'silent',
    // Every case signs up a runner from 127.0.0.1 on the one bench database: the per-address limit would refuse the fourth.
    AUTH_RATE_LIMIT: '1000000',
    // No background jobs beside the measured upload (a web process; uploads are a web process's work).
    ROLE: 'web',
  });
  // Imported only now: the server's modules bind to DATABASE_URL when they load.
  const { startServer } = await import('../../server/index.ts');
  const server = await startServer();
  const client = fork(path.join(import.meta.dirname, 'upload-client.ts'), [], { execArgv: ['--import', 'tsx'] });
  try {
    const lastBodyEnd = watchBodyEnds(server.server);
    const token = await signUpRunner(server.url);
    const warmUpPath = path.join(dataDir, `warm-up${path.extname(filePath)}`);
    writeFileSync(warmUpPath, warmUp);
    await upload(client, { base: server.url, token, path: warmUpPath, name: path.basename(warmUpPath) });
    const bareSendMs = await bareSend(client, filePath);
    const stopProfile = await profileEventLoop(process.env.BENCH_PROFILE);
    const threads0 = threadCpu();
    const cpu0 = process.cpuUsage();
    const answer = await upload(client, { base: server.url, token, path: filePath, name: path.basename(filePath) });
    const cpu = process.cpuUsage(cpu0);
    const byThread = threadCpuSince(threads0);
    await stopProfile();
    const received = lastBodyEnd() ?? Number.NaN;
    if (!(received > answer.started_at)) throw new Error('the server never saw the end of the upload body');
    return {
      status: answer.status,
      imported: answer.imported,
      total_ms: Math.round(answer.answered_at - answer.started_at),
      receive_ms: Math.round(received - answer.started_at),
      import_ms: Math.round(answer.answered_at - received),
      bare_send_ms: bareSendMs,
      client: CLIENT,
      cpu_ms: Math.round((cpu.user + cpu.system) / 1000),
      cpu_ms_by_thread: byThread.cpu,
      wait_ms_by_thread: byThread.wait,
    };
  } finally {
    client.kill();
    await server.close();
    rmSync(dataDir, { recursive: true, force: true });
  }
}
