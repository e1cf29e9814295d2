import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { requireActor } from './authorize.ts';
import { AppError } from './errors.ts';

/**
 * At most `max` requests per signed-in user per `windowMs` (counted in this process's memory, like
 * the sign-in limiter); the next gets a 429 with `message`. Runs after the caller is known.
 */
export function perUserRateLimit(options: { windowMs: number; max: number; code: string; message: string }): RequestHandler {
  return rateLimit({
    windowMs: options.windowMs,
    limit: options.max,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (_req, res) => `user:${requireActor(res).id}`,
    handler: () => {
      throw new AppError(429, options.code, options.message);
    },
  });
}
