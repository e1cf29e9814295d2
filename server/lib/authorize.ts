import type { RequestHandler, Response } from 'express';
import { hasPermission, type Permission } from '../../shared/auth/permissions.ts';
import type { UserRow } from './db.ts';
import { ForbiddenError, UnauthorizedError } from './errors.ts';

/** Set by `authenticate`: the signed-in user, or null. `sessionEnded` when a cookie was present but no longer valid. */
export interface AuthLocals {
  actor: UserRow | null;
  sessionEnded?: boolean;
  /** The `sessions` row of a cookie-authenticated request; null for bearer tokens and the signed out. */
  sessionId?: string | null;
  /**
   * The signed-in user's input counter, read with their row (`week_input_counters`: bumped by every write to
   * their runs, plans, notes and weeks); ready answers are served only while it is unchanged. Null when signed out.
   */
  inputsCounter?: string | null;
}

/**
 * The signed-in user of a request made with a session cookie (a browser), not a bearer token:
 * minting tokens and changing the password need it, so a leaked script token cannot outlive its
 * own revocation or take over the account (issue 13 #12).
 */
export function requireCookieSession(res: Response): { actor: UserRow; sessionId: string } {
  const actor = requireActor(res);
  const { sessionId } = res.locals as AuthLocals;
  if (!sessionId)
    throw new ForbiddenError(
      'This needs you signed in on the website: an API token cannot do it. Sign in on the profile page and try there.',
      'cookie-session-required',
    );
  return { actor, sessionId };
}

/** The signed-in user of this request; 401 when there is none. */
export function requireActor(res: Response): UserRow {
  const { actor, sessionEnded } = res.locals as AuthLocals;
  if (!actor) {
    throw sessionEnded
      ? new UnauthorizedError('Your session has ended. Please sign in again.', 'session-ended')
      : new UnauthorizedError();
  }
  return actor;
}

/**
 * Route guard, the one place that decides who may call a route: `public` lets anyone in,
 * a permission needs a signed-in user whose role has it (shared/auth/permissions.ts).
 */
export function authorize(permission: Permission | 'public'): RequestHandler {
  return (_req, res, next) => {
    if (permission !== 'public') {
      const actor = requireActor(res);
      if (!hasPermission(actor.role, permission)) throw new ForbiddenError();
    }
    next();
  };
}
