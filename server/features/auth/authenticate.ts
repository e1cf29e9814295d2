import type { RequestHandler } from 'express';
import { SESSION_COOKIE } from '../../../shared/auth/schemas.ts';
import type { AppConfig } from '../../config.ts';
import type { AuthLocals } from '../../lib/authorize.ts';
import { UnauthorizedError } from '../../lib/errors.ts';
import { verifySession } from '../../lib/session.ts';
import { resolveApiToken } from '../tokens/index.ts';
import { findSessionCaller } from './sessions.repository.ts';
import { clearSessionCookie } from './sessions.service.ts';

const BEARER = /^Bearer\s+(\S+)$/i;

/**
 * Finds who is calling: a bearer token (scripts) or the session cookie (browser).
 * The user row is read on every request so role changes and deletions apply at once; for a cookie
 * it is read through the session's row, so an ended session (sign-out, reset) stops at once too.
 */
export function authenticate(config: AppConfig): RequestHandler {
  return async (req, res, next) => {
    const locals = res.locals as AuthLocals;
    locals.actor = null;
    locals.sessionId = null;
    locals.inputsCounter = null;
    const authorization = req.get('authorization');
    if (authorization) {
      const token = BEARER.exec(authorization)?.[1];
      // One query for the token, its user and their input counter: the user row is still read on every request.
      const caller = token ? await resolveApiToken(token) : null;
      if (!caller) throw new UnauthorizedError('This API token is not valid, has been revoked or has expired.', 'invalid-token');
      locals.actor = caller.user;
      locals.inputsCounter = caller.inputsCounter;
      return next();
    }
    const sessionToken = (req.cookies as Record<string, string | undefined>)[SESSION_COOKIE];
    if (sessionToken) {
      const claims = verifySession(sessionToken, config);
      const caller = claims ? await findSessionCaller(claims.sessionId, claims.userId, new Date()) : undefined;
      if (caller && claims) {
        locals.actor = caller.user;
        locals.inputsCounter = caller.inputsCounter;
        locals.sessionId = claims.sessionId;
      } else {
        locals.sessionEnded = true;
        clearSessionCookie(res, config);
      }
    }
    next();
  };
}
