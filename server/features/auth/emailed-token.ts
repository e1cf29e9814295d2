import { createHash, randomBytes } from 'node:crypto';
import { AppError } from '../../lib/errors.ts';

// A single-use link sent by e-mail (a password reset, a sign-up confirmation): 32 random bytes
// after a short prefix; only the SHA-256 of the token is stored, so a copy of the database cannot
// be used to follow a link. A link works once and until it expires.

/** What one kind of e-mailed link is called and how its refusals read. */
export interface EmailedTokenKind {
  /** `rst_`, `sgn_`: shows at a glance what a leaked token was for (and lets logs redact it). */
  prefix: string;
  invalid: { code: string; message: string };
  used: { code: string; message: string };
  expired: { code: string; message: string };
}

export const hashEmailedToken = (token: string) => createHash('sha256').update(token).digest('hex');

/** A new token of this kind and the hash to store. */
export function newEmailedToken(kind: EmailedTokenKind): { token: string; tokenHash: string } {
  const token = kind.prefix + randomBytes(32).toString('base64url');
  return { token, tokenHash: hashEmailedToken(token) };
}

/** The 410 for a link that was used (also when a second request claims it a moment later). */
export const linkUsedError = (kind: EmailedTokenKind) => new AppError(410, kind.used.code, kind.used.message);

/**
 * The stored row of a genuine, unused, unexpired link: 400 for a malformed or unknown token (looked
 * up only when well-formed), 410 for a used or expired one. The caller still claims the row
 * (`used_at`) in its own transaction, so two requests at once cannot both use it.
 */
export async function usableEmailedToken<Row extends { used_at: Date | null; expires_at: Date }>(
  kind: EmailedTokenKind,
  token: string,
  now: Date,
  findByHash: (tokenHash: string) => Promise<Row | undefined>,
): Promise<Row> {
  const wellFormed = token.startsWith(kind.prefix) && /^[A-Za-z0-9_-]{43}$/.test(token.slice(kind.prefix.length));
  const row = wellFormed ? await findByHash(hashEmailedToken(token)) : undefined;
  if (!row) throw new AppError(400, kind.invalid.code, kind.invalid.message);
  if (row.used_at) throw linkUsedError(kind);
  if (row.expires_at <= now) throw new AppError(410, kind.expired.code, kind.expired.message);
  return row;
}
