import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { requireActor } from './authorize.ts';
import { AppError } from './errors.ts';
import { PostgresRateLimitStore } from './postgres-rate-limit-store.ts';

/**
 * At most `max` requests per signed-in user per `windowMs`, counted in PostgreSQL so every web process
 * enforces the one limit (README.md, "Shared limits"); the next gets a 429 with `message`. `name` tells
 * this limiter's counts from every other's. Runs after the caller is known.
 */
export function perUserRateLimit(options: {
  name: string;
  windowMs: number;
  max: number;
  code: string;
  message: string;
}): RequestHandler {
  return rateLimit({
    windowMs: options.windowMs,
    limit: options.max,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new PostgresRateLimitStore(`${options.name}:`),
    keyGenerator: (_req, res) => `user:${requireActor(res).id}`,
    handler: () => {
      throw new AppError(429, options.code, options.message);
    },
  });
}
