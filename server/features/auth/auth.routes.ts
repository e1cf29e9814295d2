import { randomUUID } from 'node:crypto';
import { rateLimit } from 'express-rate-limit';
import {
  ApiTokenListAnswerSchema,
  ChangePasswordInputSchema,
  CreateTokenInputSchema,
  LoginInputSchema,
  MessageResponseSchema,
  NamedTokenInputSchema,
  PasswordResetInputSchema,
  PasswordResetRequestSchema,
  RESET_SENT_MESSAGE,
  RegisterInputSchema,
  SIGN_UP_SENT_MESSAGE,
  SignUpAnswerSchema,
  SignUpConfirmedSchema,
  TokenResponseSchema,
  UserResponseSchema,
  type RegisterInput,
  type SignUpAnswer,
} from '../../../shared/auth/schemas.ts';
import type { AppConfig } from '../../config.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { requireActor, requireCookieSession, type AuthLocals } from '../../lib/authorize.ts';
import { AppError } from '../../lib/errors.ts';
import { PostgresRateLimitStore } from '../../lib/postgres-rate-limit-store.ts';
import { parseIdParam, readTokenParam } from '../../lib/ids.ts';
import { issueApiToken, listTokensOf, revokeToken } from '../tokens/index.ts';
import { toUser } from '../users/index.ts';
import { changePassword, checkCredentials } from './auth.service.ts';
import { confirmSignUp, requestSignUp, signUpByInvitation } from './sign-up.service.ts';
import { afterAnswer } from '../../lib/after-answer.ts';
import { deleteSession } from './sessions.repository.ts';
import { clearSessionCookie, endSessionsOf, startSession } from './sessions.service.ts';
import { requestPasswordReset, resetPassword } from './password-reset.service.ts';
import type { Mailer } from '../../lib/mailer.ts';

export function createAuthRouter(config: AppConfig, mailer: Mailer) {
  const api = createApiRouter();
  // Sign-ups and reset requests per address (every request counts, in PostgreSQL so every web process
  // shares the count); password checks have their own limiter that counts failures only (credential-limiter.ts).
  const addressLimiter = rateLimit({
    windowMs: config.authRateLimit.windowMs,
    limit: config.authRateLimit.max,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new PostgresRateLimitStore('sign-up-and-reset:'),
    handler: () => {
      throw new AppError(
        429,
        'too-many-attempts',
        'Too many requests from this address. Please wait a few minutes and try again.',
      );
    },
  });

  api.route(
    {
      method: 'post',
      path: '/auth/register',
      tag: 'auth',
      summary:
        'Sign up (runner or coach): 201 with the user and confirmation "sent" — the same answer for a new and a taken address, no cookie; ' +
        'the account is made from the e-mailed link. Through an invitation to the invited address: 201, confirmation "not-needed" and the session cookie',
      access: 'public',
      body: RegisterInputSchema,
      response: SignUpAnswerSchema,
      status: 201,
      before: [addressLimiter],
    },
    async (req, res) => {
      const input = req.body as RegisterInput;
      const invited = await signUpByInvitation(input, config);
      if (invited) {
        await startSession(res, invited.id, config);
        res.status(201).json({ user: toUser(invited), confirmation: 'not-needed' } satisfies SignUpAnswer);
        return;
      }
      // The same answer, at once, for a new address and one that has an account (issue 13 #7): a
      // fresh id either way; it becomes the account's id when a new address's link is used.
      const id = randomUUID();
      afterAnswer(res, 'sign-up', () => requestSignUp(id, input, mailer, config));
      res.status(201).json({
        user: { id, email: input.email, name: input.name, role: input.role },
        confirmation: 'sent',
        message: SIGN_UP_SENT_MESSAGE,
      } satisfies SignUpAnswer);
    },
  );

  api.route(
    {
      method: 'post',
      path: '/auth/register/:token',
      tag: 'auth',
      summary: 'Finish signing up with the e-mailed link: makes the account and signs in; 400 forged, 410 used or expired',
      access: 'public',
      params: { token: readTokenParam },
      response: SignUpConfirmedSchema,
      status: 201,
      before: [addressLimiter],
    },
    async (req, res) => {
      const { row, answer } = await confirmSignUp(req.params.token);
      await startSession(res, row.id, config);
      res.status(201).json(answer);
    },
  );

  api.route(
    {
      method: 'post',
      path: '/auth/login',
      tag: 'auth',
      summary: 'Sign in with e-mail and password; sets the session cookie',
      access: 'public',
      body: LoginInputSchema,
      response: UserResponseSchema,
    },
    async (req, res) => {
      const user = await checkCredentials(req.body, config, req.ip);
      await startSession(res, user.id, config);
      res.json({ user: toUser(user) });
    },
  );

  api.route(
    {
      method: 'post',
      path: '/auth/logout',
      tag: 'auth',
      summary: 'Sign out: ends this session on the server and clears its cookie',
      access: 'public',
      status: 204,
    },
    async (_req, res) => {
      const { sessionId } = res.locals as AuthLocals;
      if (sessionId) await deleteSession(sessionId);
      clearSessionCookie(res, config);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'post',
      path: '/auth/sign-out-everywhere',
      tag: 'auth',
      summary: 'End every session of the signed-in user, on every device (API tokens stay; revoke them one by one)',
      access: 'own-data',
      status: 204,
    },
    async (_req, res) => {
      await endSessionsOf(requireActor(res).id);
      clearSessionCookie(res, config);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'post',
      path: '/me/password',
      tag: 'auth',
      summary: 'Change the password (current one required; website sessions only): every other session and every API token ends',
      access: 'own-data',
      body: ChangePasswordInputSchema,
      status: 204,
    },
    async (req, res) => {
      const { actor, sessionId } = requireCookieSession(res);
      await changePassword(actor, sessionId, req.body, config, req.ip);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'get',
      path: '/auth/me',
      tag: 'auth',
      summary: 'The signed-in user',
      access: 'own-data',
      response: UserResponseSchema,
    },
    (_req, res) => {
      res.json({ user: toUser(requireActor(res)) });
    },
  );

  api.route(
    {
      method: 'post',
      path: '/auth/token',
      tag: 'auth',
      summary: 'Get a bearer token for scripts from e-mail and password',
      access: 'public',
      body: CreateTokenInputSchema,
      response: TokenResponseSchema,
    },
    async (req, res) => {
      const user = await checkCredentials(req.body, config, req.ip);
      const issued = await issueApiToken(user.id, 'Script token', config);
      res.json(issued);
    },
  );

  api.route(
    {
      method: 'get',
      path: '/auth/tokens',
      tag: 'auth',
      summary: "The signed-in user's live API tokens (never the tokens themselves)",
      access: 'own-data',
      response: ApiTokenListAnswerSchema,
    },
    async (_req, res) => {
      res.json({ tokens: await listTokensOf(requireActor(res).id) });
    },
  );

  api.route(
    {
      method: 'post',
      path: '/auth/tokens',
      tag: 'auth',
      summary: 'Create a named API token while signed in on the website (shown once); an API token cannot make another',
      access: 'own-data',
      body: NamedTokenInputSchema,
      response: TokenResponseSchema,
      status: 201,
    },
    async (req, res) => {
      const { actor } = requireCookieSession(res);
      res.status(201).json(await issueApiToken(actor.id, req.body.name, config));
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/auth/tokens/:id',
      tag: 'auth',
      summary: 'Revoke one of your API tokens',
      access: 'own-data',
      params: { id: parseIdParam },
      status: 204,
    },
    async (req, res) => {
      await revokeToken(requireActor(res).id, req.params.id);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'post',
      path: '/auth/password-reset',
      tag: 'auth',
      summary:
        'E-mail a single-use link (valid one hour) to choose a new password; 202 whether or not the address has an account',
      access: 'public',
      body: PasswordResetRequestSchema,
      response: MessageResponseSchema,
      status: 202,
      before: [addressLimiter],
    },
    async (req, res) => {
      // Answered first, looked up and sent afterwards: the same answer at the same speed for every address.
      const email = (req.body as { email: string }).email;
      afterAnswer(res, 'password reset request', () => requestPasswordReset(email, mailer, config));
      res.status(202).json({ message: RESET_SENT_MESSAGE });
    },
  );

  api.route(
    {
      method: 'post',
      path: '/auth/password-reset/:token',
      tag: 'auth',
      summary: 'Choose a new password with a reset link; 400 forged, 410 used or expired',
      access: 'public',
      params: { token: readTokenParam },
      body: PasswordResetInputSchema,
      status: 204,
      before: [addressLimiter],
    },
    async (req, res) => {
      await resetPassword(req.params.token, req.body.password, config);
      res.status(204).end();
    },
  );

  return api;
}
