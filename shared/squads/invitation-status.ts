/** The states of an invitation link, as the invite page and the accept route report them. */
export type InvitationStatus = 'open' | 'accepted' | 'revoked' | 'expired';

/**
 * Why an invitation can no longer be accepted, in words for the invited person. The accept route
 * answers with the same sentence (410), so the invite page can say it before anyone signs in.
 */
export const INVITATION_GONE: Readonly<Record<Exclude<InvitationStatus, 'open'>, string>> = {
  accepted: 'This invitation has already been used. Ask your coach for a new one if you need it.',
  revoked: 'This invitation was withdrawn by the coach.',
  expired: 'This invitation has expired. Ask your coach to send a new one.',
};
