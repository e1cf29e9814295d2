import type { ClientRateLimitInfo, IncrementResponse, Options, Store } from 'express-rate-limit';
import { sweepSharedLimitsNowAndThen } from './shared-limits-sweep.ts';
import { countHit, forgetHits, forgetHitsStartingWith, hitsOf, uncountHit } from './shared-limits.repository.ts';

/**
 * An express-rate-limit store that keeps its counts in PostgreSQL (table `rate_limit_hits`), so a
 * limit holds across every web process on the database: requests split between processes add up
 * to one count. Windows are fixed, starting at a caller's first request, like the package's memory
 * store. `prefix` names the limiter: each limiter needs its own (the package refuses a store shared
 * between limiters, and keys such as `user:<id>` would otherwise add up across limiters).
 */
export class PostgresRateLimitStore implements Store {
  /** Keys counted here are seen by every instance of this store on the database. */
  readonly localKeys = false;
  private windowMs = 60_000;

  constructor(readonly prefix: string) {
    if (!/^[a-z][a-z0-9-]*:$/.test(prefix))
      throw new Error(`a rate-limit prefix is lower-case words and a colon, not "${prefix}"`);
  }

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const found = await hitsOf(this.prefix + key);
    return found ? { totalHits: found.hits, resetTime: found.resetAt } : undefined;
  }

  async increment(key: string): Promise<IncrementResponse> {
    sweepSharedLimitsNowAndThen();
    const counted = await countHit(this.prefix + key, this.windowMs);
    return { totalHits: counted.hits, resetTime: counted.resetAt };
  }

  async decrement(key: string): Promise<void> {
    await uncountHit(this.prefix + key);
  }

  async resetKey(key: string): Promise<void> {
    await forgetHits(this.prefix + key);
  }

  async resetAll(): Promise<void> {
    await forgetHitsStartingWith(this.prefix);
  }
}
