import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { CookieOptions, RequestHandler } from 'express';
import jwt from 'jsonwebtoken';
import { CSRF_COOKIE, CSRF_HEADER, SESSION_COOKIE } from '../../shared/auth/schemas.ts';
import type { AppConfig } from '../config.ts';
import { ForbiddenError } from './errors.ts';

const JWT_ALGORITHM = 'HS256';
const JWT_AUDIENCE = 'pacewright-session';

export interface SessionClaims {
  userId: string;
  /** The `sessions` row this cookie stands for; deleting the row ends the session. */
  sessionId: string;
}

/** Signs a session JWT for one `sessions` row, valid for the configured number of days. */
export function signSession(claims: SessionClaims, config: AppConfig): string {
  return jwt.sign({}, config.jwtSecret, {
    algorithm: JWT_ALGORITHM,
    audience: JWT_AUDIENCE,
    subject: claims.userId,
    jwtid: claims.sessionId,
    expiresIn: `${config.sessionDays}d`,
  });
}

/**
 * The user and session ids in a valid, unexpired session token, or null for anything else (forged,
 * expired, malformed, or a cookie from before sessions had rows). Whether the session is still live
 * is the database's answer (authenticate.ts).
 */
export function verifySession(token: string, config: AppConfig): SessionClaims | null {
  try {
    const claims = jwt.verify(token, config.jwtSecret, { algorithms: [JWT_ALGORITHM], audience: JWT_AUDIENCE });
    if (typeof claims !== 'object' || typeof claims.sub !== 'string' || typeof claims.jti !== 'string') return null;
    return { userId: claims.sub, sessionId: claims.jti };
  } catch {
    return null;
  }
}

export function sessionCookieOptions(config: AppConfig): CookieOptions {
  return {
    httpOnly: true,
    sameSite: 'lax',
    secure: config.env === 'production',
    path: '/',
    maxAge: config.sessionDays * 24 * 3600 * 1000,
  };
}

function csrfCookieOptions(config: AppConfig): CookieOptions {
  // Readable by the page's script on purpose: it echoes the value in the X-CSRF-Token header.
  return { httpOnly: false, sameSite: 'lax', secure: config.env === 'production', path: '/' };
}

const UNSAFE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

function sameToken(a: string, b: string): boolean {
  const ab = Buffer.from(a);
  const bb = Buffer.from(b);
  return ab.length === bb.length && timingSafeEqual(ab, bb);
}

/**
 * Double-submit CSRF defence. Every response carries a random `pw_csrf` cookie (set once);
 * a write that is authenticated by the session cookie must echo it in `X-CSRF-Token`.
 * Bearer-token requests carry no ambient credentials and are exempt.
 */
export function csrfProtection(config: AppConfig): RequestHandler {
  return (req, res, next) => {
    const cookies = (req.cookies ?? {}) as Record<string, string | undefined>;
    let csrfCookie = cookies[CSRF_COOKIE];
    if (!csrfCookie) {
      csrfCookie = randomBytes(24).toString('base64url');
      res.cookie(CSRF_COOKIE, csrfCookie, csrfCookieOptions(config));
      req.cookies = { ...cookies, [CSRF_COOKIE]: csrfCookie };
    }
    const usesSessionCookie = Boolean(cookies[SESSION_COOKIE]) && !req.headers.authorization;
    if (UNSAFE_METHODS.has(req.method) && usesSessionCookie) {
      const header = req.get(CSRF_HEADER);
      if (!header || !cookies[CSRF_COOKIE] || !sameToken(header, cookies[CSRF_COOKIE])) {
        throw new ForbiddenError('This request is missing its security token. Reload the page and try again.', 'csrf-failed');
      }
    }
    next();
  };
}
