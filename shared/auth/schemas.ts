import { z } from 'zod';
import { NameSchema, SIGN_UP_ROLES, UserSchema } from '../users/schemas.ts';

export const EmailSchema = z
  .string({ error: 'Enter your e-mail address.' })
  .trim()
  .toLowerCase()
  .max(254, 'That e-mail address is too long.')
  .pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.com.' }));

export const PASSWORD_MIN_LENGTH = 10;
export const NewPasswordSchema = z
  .string({ error: 'Choose a password.' })
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters for the password.`)
  // bcrypt only reads the first 72 bytes; longer would silently be ignored.
  .refine((p) => new TextEncoder().encode(p).length <= 72, 'Keep the password under 72 bytes.');

/** Where to go once signed up: a page of this app (a path), never another site. */
export const NextPathSchema = z
  .string()
  .max(300, 'That page address is too long.')
  .regex(/^\/(?![/\\])\S*$/, 'That is not a page of this app.');

export const RegisterInputSchema = z
  .object({
    email: EmailSchema,
    password: NewPasswordSchema,
    name: NameSchema,
    role: z.enum(SIGN_UP_ROLES, { error: 'Choose whether you sign up as a runner or a coach.' }),
    /** The page the sign-up started from (an invitation), opened again when the e-mailed link is used. */
    next: NextPathSchema.optional(),
    /**
     * The invitation link's token when the sign-up starts from one. Its e-mail already proved the
     * invited address, so a sign-up to that very address is finished at once (no second e-mail).
     */
    invitation: z.string().max(100, 'That invitation link is too long.').optional(),
  })
  .strict();
export type RegisterInput = z.infer<typeof RegisterInputSchema>;

export const LoginInputSchema = z
  .object({
    email: EmailSchema,
    password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.'),
  })
  .strict();
export type LoginInput = z.infer<typeof LoginInputSchema>;

export const UserResponseSchema = z.object({ user: UserSchema });
export type UserResponse = z.infer<typeof UserResponseSchema>;

/**
 * `POST /api/auth/register` (201). `confirmation: 'sent'` — the account is made when the e-mailed
 * link is used (`user.id` becomes its id), no cookie is set, and the body is the same for a taken
 * address (issue 13 #7). `'not-needed'` — a sign-up through an invitation to the invited address:
 * the account exists and this browser is signed in, as api-contract.md describes.
 */
export const SignUpAnswerSchema = z.object({
  user: UserSchema,
  confirmation: z.enum(['sent', 'not-needed']),
  message: z.string().optional(),
});
export type SignUpAnswer = z.infer<typeof SignUpAnswerSchema>;

/** The e-mailed sign-up link was used: the account exists and this browser is signed in. */
export const SignUpConfirmedSchema = z.object({ user: UserSchema, next: z.string().nullable() });
export type SignUpConfirmed = z.infer<typeof SignUpConfirmedSchema>;

/** The same sentence for every sign-up, whether or not the address already has an account (issue 13 #7). */
export const SIGN_UP_SENT_MESSAGE =
  'Check your e-mail. If this address is new to Pacewright, a link to finish creating your account is on its way (it works for 24 hours); if it already has an account, its owner gets a note instead. No e-mail after a few minutes? Look in the spam folder.';
export const RESET_SENT_MESSAGE = 'If that address has an account, a link to choose a new password is on its way.';

export const CreateTokenInputSchema = LoginInputSchema;
export const TokenResponseSchema = z.object({ token: z.string(), expires_at: z.string(), id: z.string() });

export const NamedTokenInputSchema = z
  .object({
    name: z
      .string({ error: 'Give the token a name.' })
      .trim()
      .min(1, 'Give the token a name.')
      .max(60, 'Keep the token name under 60 characters.'),
  })
  .strict();

export const ApiTokenSchema = z.object({
  id: z.string(),
  name: z.string(),
  created_at: z.string(),
  expires_at: z.string(),
  last_used_at: z.string().nullable(),
});
export type ApiToken = z.infer<typeof ApiTokenSchema>;
/** `GET /api/auth/tokens`: the account's live API tokens. */
export const ApiTokenListAnswerSchema = z.object({ tokens: z.array(ApiTokenSchema) });
export type ApiTokenListAnswer = z.infer<typeof ApiTokenListAnswerSchema>;

/** Cookie and header names shared by server and client. */
export const SESSION_COOKIE = 'pw_session';
export const CSRF_COOKIE = 'pw_csrf';
export const CSRF_HEADER = 'X-CSRF-Token';

export const PasswordResetRequestSchema = z.object({ email: EmailSchema }).strict();
export const PasswordResetInputSchema = z.object({ password: NewPasswordSchema }).strict();

export const ChangePasswordInputSchema = z
  .object({
    current_password: z.string({ error: 'Enter your current password.' }).min(1, 'Enter your current password.'),
    new_password: NewPasswordSchema,
  })
  .strict();
export type ChangePasswordInput = z.infer<typeof ChangePasswordInputSchema>;

/** An answer that is only a sentence for the person (sign-up, reset request). */
export const MessageResponseSchema = z.object({ message: z.string() });
export type MessageResponse = z.infer<typeof MessageResponseSchema>;

/** Live API tokens one account may hold (issue 13 #12); the profile page says so when it is reached. */
export const MAX_API_TOKENS_PER_USER = 20;
