import type { RequestHandler, Response } from 'express';
import { hasPermission, type Permission } from '../../shared/auth/permissions.ts';
import type { UserRow } from './db.ts';
import { ForbiddenError, UnauthorizedError } from './errors.ts';

/** Set by `authenticate`: the signed-in user, or null. `sessionEnded` when a cookie was present but no longer valid. */
export interface AuthLocals {
  actor: UserRow | null;
  sessionEnded?: boolean;
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
