import type { RegisterInput, SignUpConfirmed } from '../../../shared/auth/schemas.ts';
import type { AppConfig } from '../../config.ts';
import { inTransaction, type UserRow } from '../../lib/db.ts';
import { AppError } from '../../lib/errors.ts';
import { logger } from '../../lib/logger.ts';
import { htmlMessage, type Mailer } from '../../lib/mailer.ts';
import { invitationVouchesFor } from '../squads/index.ts';
import { createUser, findUserByEmail, toUser } from '../users/index.ts';
import { hashPassword } from './auth.service.ts';
import { linkUsedError, newEmailedToken, usableEmailedToken, type EmailedTokenKind } from './emailed-token.ts';
import {
  claimPendingSignUp,
  countSignUpMailsSince,
  deleteSignUpMailsBefore,
  findPendingSignUpByHash,
  insertPendingSignUp,
  insertSignUpNotice,
} from './sign-ups.repository.ts';

/** Sign-up links work once, for a day. */
export const SIGN_UP_LINK_HOURS = 24;
/** E-mails one address can be sent through the sign-up form per hour (links and "someone tried" notices). */
export const SIGN_UP_MAILS_PER_ADDRESS_PER_HOUR = 3;

const HOUR_MS = 3_600_000;

/**
 * A sign-up through an invitation link, to the invited address, of an address with no account: the
 * invitation e-mail already proved the address, so the account is made now. Undefined otherwise
 * (the sign-up then goes the e-mailed-link way like any other).
 */
export async function signUpByInvitation(
  input: RegisterInput,
  config: AppConfig,
  now = new Date(),
): Promise<UserRow | undefined> {
  if (!input.invitation || !(await invitationVouchesFor(input.invitation, input.email, now))) return undefined;
  if (await findUserByEmail(input.email)) return undefined;
  const passwordHash = await hashPassword(input.password, config);
  try {
    return await createUser({ email: input.email, passwordHash, name: input.name, role: input.role });
  } catch (err) {
    // Made a moment ago by a second request: the e-mailed-link way tells the owner instead.
    if (err instanceof AppError && err.status === 409) return undefined;
    throw err;
  }
}

/**
 * Runs after the sign-up has been answered with `id` (the same answer for every address): an
 * address with an account gets a notice instead of a second account, a new address gets the link
 * that makes the account with that id. At most SIGN_UP_MAILS_PER_ADDRESS_PER_HOUR e-mails per
 * address per hour, so the form cannot be used to flood someone's inbox.
 */
export async function requestSignUp(
  id: string,
  input: RegisterInput,
  mailer: Mailer,
  config: AppConfig,
  now = new Date(),
): Promise<void> {
  // Old rows are only kept for counting; two days is plenty.
  await deleteSignUpMailsBefore(new Date(now.getTime() - SIGN_UP_LINK_HOURS * 2 * HOUR_MS));
  if ((await countSignUpMailsSince(input.email, new Date(now.getTime() - HOUR_MS))) >= SIGN_UP_MAILS_PER_ADDRESS_PER_HOUR) {
    logger.info('sign-up e-mail not sent: the hourly limit for this address is reached');
    return;
  }

  const owner = await findUserByEmail(input.email);
  if (owner) {
    await insertSignUpNotice(input.email, now);
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

  const { token, tokenHash } = newEmailedToken(SIGN_UP_LINK);
  await insertPendingSignUp({
    id,
    token_hash: tokenHash,
    email: input.email,
    name: input.name,
    role: input.role,
    password_hash: await hashPassword(input.password, config),
    next_path: input.next ?? null,
    created_at: now,
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

const SIGN_UP_LINK: EmailedTokenKind = {
  prefix: 'sgn_',
  invalid: {
    code: 'invalid-sign-up-link',
    message: 'This sign-up link is not valid. Check that you copied the whole link, or sign up again.',
  },
  used: {
    code: 'sign-up-link-used',
    message: 'This link has already been used, so your account exists. Sign in with your e-mail and password.',
  },
  expired: { code: 'sign-up-link-expired', message: 'This sign-up link has expired. Please sign up again.' },
};

/** Makes the account of a genuine, unused, unexpired sign-up link, with the id the sign-up was answered with. */
export async function confirmSignUp(token: string, now = new Date()) {
  const row = await usableEmailedToken(SIGN_UP_LINK, token, now, (tokenHash) => findPendingSignUpByHash(tokenHash));
  const user = await inTransaction(async (trx) => {
    if (!(await claimPendingSignUp(row.id, now, trx))) throw linkUsedError(SIGN_UP_LINK);
    // 409 with a sentence when the address got an account meanwhile (two links used one after the other).
    return createUser({ id: row.id, email: row.email, passwordHash: row.password_hash, name: row.name, role: row.role }, trx);
  });
  const answer: SignUpConfirmed = { user: toUser(user), next: row.next_path };
  return { row: user, answer };
}
