/**
 * Ready answers (README.md here): the JSON of a runner's own runs list, run page and week, serialized once and
 * kept in this process, valid while the runner's input counter is the one they were built at. The counter is read
 * with the caller's user row (authenticate.ts), so a hit costs no query of its own; every other web process keeps
 * its own and checks the same counter, so a write through any process ends them all at the next request.
 */
import { createHash } from 'node:crypto';
import { replicaReadContext } from '../../lib/db.ts';
import { readInputsCounter } from './week-cache.repository.ts';

/** Most bytes of answers one process keeps; the least recently used go first. */
export const READY_ANSWERS_MAX_BYTES = 32 * 1024 * 1024;
/** Most answers one process keeps (a bound on the map itself, for many small answers). */
export const READY_ANSWERS_MAX_ENTRIES = 20_000;

/** An answer's bytes and its entity tag, computed once. */
export interface ReadyAnswer {
  body: Buffer;
  etag: string;
}

interface Entry extends ReadyAnswer {
  /** What the answer was built at (owner and counter, or a route's own stamp): kept answers are served only under it. */
  stamp: string;
  /** What the route needs to know before checking the stamp (the week review: the note ids whose read markers it shows). */
  extra: readonly string[];
}

const entries = new Map<string, Entry>();
let bytes = 0;
/** Answers being built, so requests arriving together for the same answer wait for one build. */
const building = new Map<string, Promise<ReadyAnswer>>();

function forget(key: string): void {
  const entry = entries.get(key);
  if (!entry) return;
  entries.delete(key);
  bytes -= entry.body.length;
}

function remember(key: string, entry: Entry): void {
  forget(key);
  if (entry.body.length > READY_ANSWERS_MAX_BYTES / 64) return; // one answer may not push out dozens
  entries.set(key, entry);
  bytes += entry.body.length;
  for (const oldest of entries.keys()) {
    if (bytes <= READY_ANSWERS_MAX_BYTES && entries.size <= READY_ANSWERS_MAX_ENTRIES) break;
    forget(oldest);
  }
}

/** A weak entity tag of the bytes, as Express makes one (length and SHA-1), so it is not made again per request. */
function entityTag(body: Buffer): string {
  return `W/"${body.length.toString(16)}-${createHash('sha1').update(body).digest('base64').slice(0, 27)}"`;
}

/** An answer serialized once, with its entity tag. */
export function readyJson(answer: unknown): ReadyAnswer {
  const body = Buffer.from(JSON.stringify(answer));
  return { body, etag: entityTag(body) };
}

/**
 * The answer kept under `key`, whatever it was built at: the caller compares `stamp` with what it reads now
 * (every input of the answer) before serving it. Counts as a use for the eviction order.
 */
export function keptAnswer(key: string): (ReadyAnswer & { stamp: string; extra: readonly string[] }) | undefined {
  const kept = entries.get(key);
  if (!kept) return undefined;
  // Most recently used last: the map's order is the eviction order.
  entries.delete(key);
  entries.set(key, kept);
  return kept;
}

/** Keeps `answer` under `key`, valid at `stamp` (see keptAnswer), within the same bounds as every ready answer. */
export function keepAnswer(key: string, stamp: string, answer: ReadyAnswer, extra: readonly string[] = []): void {
  remember(key, { ...answer, stamp, extra });
}

/**
 * The answer `key` of runner `owner` at input counter `counter` (the caller's, read with their user row): the
 * kept one when it was built at this counter, else built now by `build` and kept. `build` runs the route's own
 * reads and checks and says whose data it answered; it is kept only when that is `owner`. Built on a read
 * replica, it is kept under the counter the replica had before the build read anything, never a newer one.
 */
export async function readyAnswer(
  key: string,
  owner: string,
  counter: string,
  build: () => Promise<{ owner: string; answer: unknown }>,
): Promise<ReadyAnswer> {
  const stampAt = (at: string) => `${owner}\u0000${at}`;
  const kept = keptAnswer(key);
  if (kept && kept.stamp === stampAt(counter)) return kept;
  const replica = replicaReadContext.getStore();
  // Requests that may share a build: same answer, same counter, same database (a replica's may be older).
  const flightKey = `${key}\u0000${owner}\u0000${counter}\u0000${replica ? 'replica' : 'primary'}`;
  let flight = building.get(flightKey);
  if (!flight) {
    flight = (async () => {
      const builtAt = replica ? await readInputsCounter(owner, replica) : counter;
      const built = await build();
      const ready = readyJson(built.answer);
      if (built.owner === owner) keepAnswer(key, stampAt(builtAt), ready);
      return ready;
    })().finally(() => building.delete(flightKey));
    building.set(flightKey, flight);
  }
  return flight;
}

/** Forgets every kept answer (tests that change data behind the counters' back). */
export function forgetReadyAnswers(): void {
  entries.clear();
  bytes = 0;
}
