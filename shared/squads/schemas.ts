import { z } from 'zod';
import { EmailSchema } from '../auth/schemas.ts';
import { FeeSchema } from '../fees/schemas.ts';
import { looksLikeLink, NO_LINKS_IN_SQUAD_NAME } from './link-check.ts';

export const CreateSquadInputSchema = z
  .object({
    name: z
      .string({ error: 'Name the squad.' })
      .trim()
      .min(1, 'Name the squad.')
      .max(80, 'Keep the squad name under 80 characters.')
      .refine((name) => !looksLikeLink(name), NO_LINKS_IN_SQUAD_NAME),
  })
  .strict();

export const InviteInputSchema = z.object({ email: EmailSchema }).strict();

export const SquadSchema = z.object({ id: z.string(), name: z.string() });
export type Squad = z.infer<typeof SquadSchema>;
/** `POST /api/squads` and `POST /api/invitations/:token/accept`: the squad made or joined. */
export const SquadAnswerSchema = z.object({ squad: SquadSchema });
export type SquadAnswer = z.infer<typeof SquadAnswerSchema>;

/** `GET /api/me/coaches`: a coach who can read the runner's data, and the squad that gives them access. */
export const CoachAccessSchema = z.object({
  squad: SquadSchema,
  coach: z.object({ id: z.string(), name: z.string(), email: z.string() }),
});
export type CoachAccess = z.infer<typeof CoachAccessSchema>;
/** `GET /api/me/coaches`: the coaches who see the runner's log. */
export const CoachAccessListAnswerSchema = z.object({ coaches: z.array(CoachAccessSchema) });
export type CoachAccessListAnswer = z.infer<typeof CoachAccessListAnswerSchema>;

export const InvitationSchema = z.object({ id: z.string(), email: z.string(), expires_at: z.string() });
export type Invitation = z.infer<typeof InvitationSchema>;
/** `POST /api/squads/:id/invitations`: the invitation sent. */
export const InvitationAnswerSchema = z.object({ invitation: InvitationSchema });
export type InvitationAnswer = z.infer<typeof InvitationAnswerSchema>;

export const InvitationPreviewSchema = z.object({
  squad: SquadSchema,
  coach: z.object({ name: z.string() }),
  email: z.string(),
  status: z.enum(['open', 'accepted', 'revoked', 'expired']),
  /** The squad's fee, shown before the runner accepts. */
  fee: FeeSchema,
});

export const SquadDetailSchema = SquadSchema.extend({
  coach: z.object({ id: z.string(), name: z.string() }),
  members: z.array(z.object({ id: z.string(), name: z.string(), email: z.string(), joined_at: z.string() })),
  invitations: z.array(InvitationSchema.extend({ status: z.enum(['open', 'accepted', 'revoked', 'expired']) })),
});
export type SquadDetail = z.infer<typeof SquadDetailSchema>;
/** `GET /api/squads`: the coach's squads with their members. */
export const SquadListAnswerSchema = z.object({ squads: z.array(SquadDetailSchema) });
export type SquadListAnswer = z.infer<typeof SquadListAnswerSchema>;

/** Days an invitation link stays valid. */
export const INVITATION_DAYS = 14;
