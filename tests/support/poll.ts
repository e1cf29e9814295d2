/**
 * The one way API tests wait for something another process or a background job does: read it again
 * every `everyMs` until it holds. The bound only ends a hang with a sentence naming what never came;
 * it is never the event itself.
 */

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** Polls `check` until it returns something other than undefined/false, and returns that; fails with `what` after `timeoutMs`. */
export async function waitUntil<T>(
  check: () => Promise<T | undefined | false> | T | undefined | false,
  what: string,
  timeoutMs = 20_000,
  everyMs = 100,
): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await check();
    if (value !== undefined && value !== false) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await pause(everyMs);
  }
}

/** Reads until `done` holds, every `everyMs`, for at most `timeoutMs`; returns the last value read (named in the failure). */
export async function pollUntil<T>(
  read: () => Promise<T>,
  done: (value: T) => boolean,
  what: string,
  timeoutMs = 20_000,
  everyMs = 100,
): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await read();
    if (done(value)) return value;
    if (Date.now() > deadline)
      throw new Error(`${what}: still not so after ${timeoutMs / 1000} s (last: ${JSON.stringify(value)})`);
    await pause(everyMs);
  }
}
