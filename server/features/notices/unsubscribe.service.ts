import { NOTICE_KIND_INFO, type NoticeKind } from '../../../shared/notices/kinds.ts';
import type { NoticeSwitches, UnsubscribeAnswer, UpdateNoticeSwitchesInput } from '../../../shared/notices/schemas.ts';
import type { AppConfig } from '../../config.ts';
import type { Db } from '../../lib/db.ts';
import { AppError, NotFoundError } from '../../lib/errors.ts';
import { findUserById } from '../users/index.ts';
import { findSwitchChangedAt, insertSwitchChanges, toNoticeSwitches, updateNoticeSwitches } from './notices.repository.ts';
import { readUnsubscribeToken, type UnsubscribeClaim } from './unsubscribe-token.ts';

export async function noticeSwitchesOf(userId: string): Promise<NoticeSwitches> {
  const user = await findUserById(userId);
  if (!user) throw new NotFoundError();
  return toNoticeSwitches(user);
}

export async function changeNoticeSwitches(userId: string, changes: UpdateNoticeSwitchesInput, now = new Date()) {
  const user = await updateNoticeSwitches(userId, changes, now);
  if (!user) throw new NotFoundError();
  return toNoticeSwitches(user);
}

/** The user and kind an unsubscribe link names; a forged link or a deleted account is a clear refusal. */
async function linkTarget(token: string, config: AppConfig) {
  const claim = readUnsubscribeToken(config.jwtSecret, token);
  if (!claim)
    throw new AppError(
      400,
      'unsubscribe-link-invalid',
      'This unsubscribe link is not valid. Check that you copied the whole link, or switch the e-mail off on your profile.',
    );
  const user = await findUserById(claim.userId);
  if (!user)
    throw new AppError(
      410,
      'unsubscribe-account-gone',
      'The account this link was for has been deleted, so it gets no e-mail at all.',
    );
  return { claim, user };
}

/**
 * A link older than the user's last change to that switch (it was turned off and on again since the
 * e-mail) no longer switches it off: the page's read and the one-click POST refuse it alike (409).
 */
async function refuseIfOutdated(userId: string, claim: UnsubscribeClaim, label: string): Promise<void> {
  const changedAt = await findSwitchChangedAt(userId, claim.kind);
  if (changedAt && changedAt > claim.issuedAt)
    throw new AppError(
      409,
      'unsubscribe-link-outdated',
      `You switched “${label}” back on after this e-mail was sent, so this old link changed nothing. Switch it off on your profile if you want it off.`,
    );
}

/**
 * What an unsubscribe link would switch off, and whether that kind is on now (the page shows it before
 * the click). An outdated link is refused here as the POST would refuse it, so the page says so at once
 * instead of offering a button that cannot work.
 */
export async function describeUnsubscribeLink(token: string, config: AppConfig): Promise<UnsubscribeAnswer> {
  const { claim, user } = await linkTarget(token, config);
  const info = NOTICE_KIND_INFO[claim.kind];
  if (user[info.column]) await refuseIfOutdated(user.id, claim, info.label);
  return { kind: claim.kind, label: info.label, on: user[info.column] };
}

/**
 * RFC 8058 one-click unsubscribe: turns off exactly the kind the link names. A second POST of the
 * same link changes nothing and says it is off; a link older than the user's last change to that
 * switch (it was turned off and on again since the e-mail) is refused and changes nothing.
 */
export async function unsubscribeByLink(token: string, config: AppConfig, now = new Date()): Promise<UnsubscribeAnswer> {
  const { claim, user } = await linkTarget(token, config);
  const info = NOTICE_KIND_INFO[claim.kind];
  if (!user[info.column]) return { kind: claim.kind, label: info.label, on: false };
  await refuseIfOutdated(user.id, claim, info.label);
  const after = await updateNoticeSwitches(user.id, { [claim.kind]: false }, now);
  return { kind: claim.kind, label: info.label, on: after ? after[info.column] : false };
}

/** Switches changed elsewhere (the profile form): unsubscribe links for them issued before `now` stop working. */
export async function recordSwitchChanges(userId: string, kinds: readonly NoticeKind[], now: Date, trx?: Db): Promise<void> {
  await insertSwitchChanges(userId, kinds, now, trx);
}
