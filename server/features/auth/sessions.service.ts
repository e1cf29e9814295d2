import type { Response } from 'express';
import { SESSION_COOKIE } from '../../../shared/auth/schemas.ts';
import type { AppConfig } from '../../config.ts';
import type { Db } from '../../lib/db.ts';
import { sessionCookieOptions, signSession } from '../../lib/session.ts';
import { deleteSessionsOf, insertSession, pruneSessionsOf } from './sessions.repository.ts';

/**
 * Live sessions kept per account. A new sign-in beyond it ends the oldest one, so repeated
 * sign-ins can never grow the table without bound (each needs the right password anyway).
 */
export const MAX_SESSIONS_PER_USER = 50;

/** Starts a session row for the user and sets its cookie on the answer. */
export async function startSession(res: Response, userId: string, config: AppConfig, now = new Date()): Promise<void> {
  const expiresAt = new Date(now.getTime() + config.sessionDays * 24 * 3600 * 1000);
  const session = await insertSession(userId, expiresAt);
  await pruneSessionsOf(userId, MAX_SESSIONS_PER_USER, now);
  res.cookie(SESSION_COOKIE, signSession({ userId, sessionId: session.id }, config), sessionCookieOptions(config));
}

export function clearSessionCookie(res: Response, config: AppConfig): void {
  const { maxAge: _maxAge, ...clearOptions } = sessionCookieOptions(config);
  res.clearCookie(SESSION_COOKIE, clearOptions);
}

/** Ends every session of the user (sign out everywhere, a reset), or every other one (a password change). */
export async function endSessionsOf(userId: string, options: { keep?: string | null; trx?: Db } = {}): Promise<number> {
  return deleteSessionsOf(userId, options.keep ?? null, options.trx);
}
