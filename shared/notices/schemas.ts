import { z } from 'zod';
import { NoticeKindSchema } from './kinds.ts';

const onOff = z.boolean({ error: 'Choose on (true) or off (false).' });

/** `GET /api/me/notices`: every notice switch of the signed-in user, true = the e-mail is sent. */
export const NoticeSwitchesSchema = z.object({
  import: onOff,
  note: onOff,
  pain_alert: onOff,
  squad_leave: onOff,
  digest: onOff,
  plan_change: onOff,
});
export type NoticeSwitches = z.infer<typeof NoticeSwitchesSchema>;

export const NoticeSwitchesAnswerSchema = z.object({ switches: NoticeSwitchesSchema });
export type NoticeSwitchesAnswer = z.infer<typeof NoticeSwitchesAnswerSchema>;

/** `PATCH /api/me/notices`: any of the switches; unknown kinds are refused. */
export const UpdateNoticeSwitchesInputSchema = NoticeSwitchesSchema.partial().strict();
export type UpdateNoticeSwitchesInput = z.infer<typeof UpdateNoticeSwitchesInputSchema>;

/**
 * The body of the one-click unsubscribe POST (RFC 8058 §3.1): a mail program sends
 * `List-Unsubscribe=One-Click` form-encoded; the unsubscribe page sends the same as JSON.
 */
export const OneClickUnsubscribeBodySchema = z.object(
  {
    'List-Unsubscribe': z.literal('One-Click', { error: 'Send List-Unsubscribe=One-Click to turn this notice off.' }),
  },
  { error: 'Send List-Unsubscribe=One-Click to turn this notice off.' },
);

/** What an unsubscribe link is about (`GET`) and what the POST changed. */
export const UnsubscribeAnswerSchema = z.object({
  kind: NoticeKindSchema,
  /** The switch's label, as the profile shows it. */
  label: z.string(),
  /** Whether that kind of e-mail is still sent. */
  on: z.boolean(),
});
export type UnsubscribeAnswer = z.infer<typeof UnsubscribeAnswerSchema>;
