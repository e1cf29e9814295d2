import { createHmac, timingSafeEqual } from 'node:crypto';
import { NoticeKindSchema, type NoticeKind } from '../../../shared/notices/kinds.ts';

/**
 * The token of a one-click unsubscribe link (RFC 8058): who, which kind of notice, and when the
 * e-mail was sent, signed with HMAC-SHA-256 under a key derived from the server secret. It needs no
 * sign-in and can do exactly one thing: turn that kind off for that user. Format:
 * `uns_` + base64url("<user id>.<kind>.<unix milliseconds>") + 43 characters of base64url MAC, so the
 * log redaction of `uns_…` covers it whole.
 */
const PREFIX = 'uns_';
const MAC_LENGTH = 43;
const PURPOSE = 'pacewright-unsubscribe-v1';

export interface UnsubscribeClaim {
  userId: string;
  kind: NoticeKind;
  issuedAt: Date;
}

const keyFor = (secret: string) => createHmac('sha256', secret).update(PURPOSE).digest();
const macOf = (secret: string, payload: string) => createHmac('sha256', keyFor(secret)).update(payload).digest('base64url');

export function signUnsubscribeToken(secret: string, claim: UnsubscribeClaim): string {
  const payload = Buffer.from(`${claim.userId}.${claim.kind}.${claim.issuedAt.getTime()}`).toString('base64url');
  return `${PREFIX}${payload}${macOf(secret, payload)}`;
}

/** The claim of a well-formed token with a valid signature; null for anything else (never throws). */
export function readUnsubscribeToken(secret: string, token: string): UnsubscribeClaim | null {
  if (!/^uns_[A-Za-z0-9_-]{44,200}$/.test(token)) return null;
  const body = token.slice(PREFIX.length);
  const payload = body.slice(0, -MAC_LENGTH);
  const given = Buffer.from(body.slice(-MAC_LENGTH));
  const expected = Buffer.from(macOf(secret, payload));
  if (given.length !== expected.length || !timingSafeEqual(given, expected)) return null;
  const match = /^([0-9a-f-]{36})\.([a-z_]+)\.(\d{1,15})$/.exec(Buffer.from(payload, 'base64url').toString('utf8'));
  const kind = NoticeKindSchema.safeParse(match?.[2]);
  if (!match || !kind.success) return null;
  return { userId: match[1]!, kind: kind.data, issuedAt: new Date(Number(match[3])) };
}
