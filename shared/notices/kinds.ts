import { z } from 'zod';
import { PLAN_NOTICE_QUIET_MINUTES } from '../plans/plan-notice.ts';
import type { Role } from '../users/schemas.ts';

/**
 * Every kind of notice e-mail a user can switch off (issue 16). Invitations and password resets are
 * not notices: the user asked for them, so no switch stops them.
 */
export const NOTICE_KINDS = ['import', 'note', 'pain_alert', 'squad_leave', 'digest', 'plan_change'] as const;
export const NoticeKindSchema = z.enum(NOTICE_KINDS, { error: 'Unknown kind of notice.' });
export type NoticeKind = z.infer<typeof NoticeKindSchema>;

export interface NoticeKindInfo {
  /** Who can receive this kind (the profile shows only those switches). */
  roles: readonly Role[];
  /** The switch's label on the profile and the name used in an unsubscribe answer. */
  label: string;
  /** When and how often it comes. */
  hint: string;
  /** The users column that holds the switch. */
  column: `notify_on_${NoticeKind}`;
}

export const NOTICE_KIND_INFO: Record<NoticeKind, NoticeKindInfo> = {
  import: {
    roles: ['coach', 'admin'],
    label: 'Uploads by runners in my squads',
    hint: 'One e-mail per upload: files dropped together or one archive, sent a minute after the last file arrives.',
    column: 'notify_on_import',
  },
  note: {
    roles: ['runner', 'coach', 'admin'],
    label: 'New notes written to me',
    hint: 'Notes on your runs and weeks (or your runners’), gathered: at most one e-mail every 15 minutes, listing each new note.',
    column: 'notify_on_note',
  },
  pain_alert: {
    roles: ['coach', 'admin'],
    label: 'A runner reports pain, illness or high soreness',
    hint: 'Sent at once when a check-in reports soreness 4 or 5, or a note is marked as about pain or illness.',
    column: 'notify_on_pain_alert',
  },
  squad_leave: {
    roles: ['coach', 'admin'],
    label: 'A runner leaves one of my squads',
    hint: 'Sent at once; the runner’s data is no longer yours to read.',
    column: 'notify_on_squad_leave',
  },
  digest: {
    roles: ['coach', 'admin'],
    label: 'The weekly squad digest',
    hint: 'Each squad’s week in one e-mail, sent by the weekly digest job.',
    column: 'notify_on_digest',
  },
  plan_change: {
    roles: ['runner'],
    label: 'My coach changes my plan',
    hint: `One e-mail once your coach has finished a round of changes (${PLAN_NOTICE_QUIET_MINUTES} minutes after the last one), listing them.`,
    column: 'notify_on_plan_change',
  },
};

/** The kinds a user of `role` can receive, in the order the profile lists them. */
export function noticeKindsFor(role: Role): NoticeKind[] {
  return NOTICE_KINDS.filter((kind) => NOTICE_KIND_INFO[kind].roles.includes(role));
}
