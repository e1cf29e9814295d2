import type { AppConfig } from '../../config.ts';
import { inTransaction } from '../../lib/db.ts';
import { logger } from '../../lib/logger.ts';
import { htmlMessage, type Mailer } from '../../lib/mailer.ts';
import { endApiTokensOf } from '../tokens/index.ts';
import { findUserByEmail, setPasswordHash } from '../users/index.ts';
import { hashPassword } from './auth.service.ts';
import { linkUsedError, newEmailedToken, usableEmailedToken, type EmailedTokenKind } from './emailed-token.ts';
import {
  claimPasswordReset,
  countResetsSince,
  findPasswordResetByHash,
  insertPasswordReset,
  useUpResetsOf,
} from './password-resets.repository.ts';
import { endSessionsOf } from './sessions.service.ts';

/** Reset links work once, for an hour. */
export const RESET_LINK_MINUTES = 60;
/** Reset e-mails one address can be sent per hour; more requests are answered the same and send nothing. */
export const RESET_MAILS_PER_ADDRESS_PER_HOUR = 3;

const RESET_LINK: EmailedTokenKind = {
  prefix: 'rst_',
  invalid: {
    code: 'invalid-reset-link',
    message: 'This reset link is not valid. Check that you copied the whole link, or ask for a new one.',
  },
  used: { code: 'reset-link-used', message: 'This reset link has already been used. Ask for a new one if you need it.' },
  expired: { code: 'reset-link-expired', message: 'This reset link has expired. Ask for a new one.' },
};

/**
 * Sends a reset link when the address belongs to an account. It runs after the request has been
 * answered (the same answer, at the same speed, either way), so the form does not reveal who has
 * an account; at most RESET_MAILS_PER_ADDRESS_PER_HOUR links per address and hour.
 */
export async function requestPasswordReset(email: string, mailer: Mailer, config: AppConfig, now = new Date()): Promise<void> {
  const user = await findUserByEmail(email);
  if (!user) return;
  if ((await countResetsSince(user.id, new Date(now.getTime() - 3_600_000))) >= RESET_MAILS_PER_ADDRESS_PER_HOUR) {
    logger.info({ user: user.id }, 'reset e-mail not sent: the hourly limit for this address is reached');
    return;
  }
  const { token, tokenHash } = newEmailedToken(RESET_LINK);
  const link = `${config.publicUrl}/reset-password/${token}`;
  await insertPasswordReset({
    userId: user.id,
    tokenHash,
    createdAt: now,
    expiresAt: new Date(now.getTime() + RESET_LINK_MINUTES * 60_000),
  });
  const lines = [
    `Someone (we hope you) asked to choose a new password for ${user.email} on Pacewright.`,
    `The link works once, for ${RESET_LINK_MINUTES} minutes. If you did not ask for it, ignore this e-mail: your password stays as it is.`,
  ];
  await mailer.send({
    to: user.email,
    subject: 'Choose a new Pacewright password',
    text: `${lines.join('\n\n')}\n\nChoose a new password: ${link}\n`,
    html: htmlMessage('Choose a new password', lines, { href: link, label: 'Choose a new password' }),
  });
}

/** Sets the new password if the link is genuine, unused and unexpired; the link is used up either way it succeeds. */
export async function resetPassword(token: string, password: string, config: AppConfig, now = new Date()): Promise<void> {
  const row = await usableEmailedToken(RESET_LINK, token, now, (tokenHash) => findPasswordResetByHash(tokenHash));
  const passwordHash = await hashPassword(password, config);
  await inTransaction(async (trx) => {
    if (!(await claimPasswordReset(row.id, now, trx))) throw linkUsedError(RESET_LINK);
    await setPasswordHash(row.user_id, passwordHash, { updatedAt: now }, trx);
    // A new password ends every script token and every session opened under the old one (issue 13 #3),
    // and every other reset link still outstanding (#10): whoever held one must not undo this reset.
    await endApiTokensOf(row.user_id, trx);
    await endSessionsOf(row.user_id, { trx });
    await useUpResetsOf(row.user_id, now, trx);
  });
}
