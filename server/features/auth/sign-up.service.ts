import { createHash, randomBytes } from 'node:crypto';
import type { RegisterInput, SignUpConfirmed } from '../../../shared/auth/schemas.ts';
import type { AppConfig } from '../../config.ts';
import { db } from '../../lib/db.ts';
import { AppError } from '../../lib/errors.ts';
import { logger } from '../../lib/logger.ts';
import { htmlMessage, type Mailer } from '../../lib/mailer.ts';
import { findUserByEmail, insertUser, toUser } from '../users/users.repository.ts';
import { hashPassword } from './auth.service.ts';

/** Sign-up links work once, for a day. */
export const SIGN_UP_LINK_HOURS = 24;
/** E-mails one address can be sent through the sign-up form per hour (links and "someone tried" notices). */
export const SIGN_UP_MAILS_PER_ADDRESS_PER_HOUR = 3;

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');
const HOUR_MS = 3_600_000;

/**
 * Runs after the sign-up has been answered (the same sentence for every address): an address with
 * an account gets a notice instead of a second account, a new address gets the link that makes
 * the account. At most SIGN_UP_MAILS_PER_ADDRESS_PER_HOUR e-mails per address per hour, so the
 * form cannot be used to flood someone's inbox.
 */
export async function requestSignUp(input: RegisterInput, mailer: Mailer, config: AppConfig, now = new Date()): Promise<void> {
  // Old rows are only kept for counting; a day is plenty.
  await db('sign_up_requests')
    .where('created_at', '<', new Date(now.getTime() - SIGN_UP_LINK_HOURS * 2 * HOUR_MS))
    .delete();
  const [{ recent }] = (await db('sign_up_requests')
    .where({ email: input.email })
    .andWhere('created_at', '>', new Date(now.getTime() - HOUR_MS))
    .count({ recent: '*' })) as [{ recent: string | number }];
  if (Number(recent) >= SIGN_UP_MAILS_PER_ADDRESS_PER_HOUR) {
    logger.info('sign-up e-mail not sent: the hourly limit for this address is reached');
    return;
  }

  const owner = await findUserByEmail(input.email);
  if (owner) {
    await db('sign_up_requests').insert({ email: input.email, expires_at: now });
    const lines = [
      `Someone tried to create a Pacewright account with ${owner.email}, which already has one. No second account was made and nothing changed.`,
      'If it was you: sign in with your password, or choose a new one with “Forgot your password?” on the sign-in page. If it was not you, there is nothing to do.',
    ];
    const link = `${config.publicUrl}/sign-in`;
    await mailer.send({
      to: owner.email,
      subject: 'Someone tried to sign up with your address on Pacewright',
      text: `${lines.join('\n\n')}\n\nSign in: ${link}\n`,
      html: htmlMessage('Someone tried to sign up with your address', lines, { href: link, label: 'Sign in' }),
    });
    return;
  }

  const token = 'sgn_' + randomBytes(32).toString('base64url');
  await db('sign_up_requests').insert({
    email: input.email,
    token_hash: hashToken(token),
    name: input.name,
    role: input.role,
    password_hash: await hashPassword(input.password, config),
    next_path: input.next ?? null,
    expires_at: new Date(now.getTime() + SIGN_UP_LINK_HOURS * HOUR_MS),
  });
  const link = `${config.publicUrl}/sign-up/confirm/${token}`;
  const lines = [
    `Welcome to Pacewright, ${input.name}. Use the link below to finish creating your ${input.role} account for ${input.email}.`,
    `The link works once, for ${SIGN_UP_LINK_HOURS} hours. If you did not sign up, ignore this e-mail: no account is made without it.`,
  ];
  await mailer.send({
    to: input.email,
    subject: 'Finish creating your Pacewright account',
    text: `${lines.join('\n\n')}\n\nFinish creating your account: ${link}\n`,
    html: htmlMessage('Finish creating your account', lines, { href: link, label: 'Finish creating my account' }),
  });
}

/** Makes the account of a genuine, unused, unexpired sign-up link. */
export async function confirmSignUp(token: string, now = new Date()) {
  const row = /^sgn_[A-Za-z0-9_-]{43}$/.test(token)
    ? await db('sign_up_requests')
        .where({ token_hash: hashToken(token) })
        .first()
    : undefined;
  if (!row?.password_hash || !row.name || !row.role)
    throw new AppError(
      400,
      'invalid-sign-up-link',
      'This sign-up link is not valid. Check that you copied the whole link, or sign up again.',
    );
  if (row.used_at)
    throw new AppError(
      410,
      'sign-up-link-used',
      'This link has already been used, so your account exists. Sign in with your e-mail and password.',
    );
  if (row.expires_at <= now)
    throw new AppError(410, 'sign-up-link-expired', 'This sign-up link has expired. Please sign up again.');
  const { password_hash: passwordHash, name, role } = row;
  const user = await db.transaction(async (trx) => {
    const claimed = await trx('sign_up_requests').where({ id: row.id }).whereNull('used_at').update({ used_at: now });
    if (!claimed)
      throw new AppError(
        410,
        'sign-up-link-used',
        'This link has already been used, so your account exists. Sign in with your e-mail and password.',
      );
    // 409 with a sentence when the address got an account meanwhile (two links used one after the other).
    return insertUser({ email: row.email, passwordHash, name, role }, trx);
  });
  const answer: SignUpConfirmed = { user: toUser(user), next: row.next_path };
  return { row: user, answer };
}
