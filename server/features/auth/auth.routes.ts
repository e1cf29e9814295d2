import { rateLimit } from 'express-rate-limit';
import { z } from 'zod';
import {
  ApiTokenSchema,
  CreateTokenInputSchema,
  LoginInputSchema,
  NamedTokenInputSchema,
  PasswordResetInputSchema,
  PasswordResetRequestSchema,
  RegisterInputSchema,
  SESSION_COOKIE,
  TokenResponseSchema,
  UserResponseSchema,
} from '../../../shared/auth/schemas.ts';
import type { AppConfig } from '../../config.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { requireActor } from '../../lib/authorize.ts';
import { AppError } from '../../lib/errors.ts';
import { parseIdParam } from '../../lib/ids.ts';
import { sessionCookieOptions, signSession } from '../../lib/session.ts';
import { issueApiToken, listTokensOf, revokeToken } from '../tokens/tokens.service.ts';
import { toUser } from '../users/users.repository.ts';
import { checkCredentials, registerUser } from './auth.service.ts';
import { requestPasswordReset, resetPassword } from './password-reset.service.ts';
import type { Mailer } from '../../lib/mailer.ts';

export function createAuthRouter(config: AppConfig, mailer: Mailer) {
  const api = createApiRouter();
  const credentialLimiter = rateLimit({
    windowMs: config.authRateLimit.windowMs,
    limit: config.authRateLimit.max,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: () => {
      throw new AppError(
        429,
        'too-many-attempts',
        'Too many attempts from this address. Please wait a few minutes and try again.',
      );
    },
  });

  api.route(
    {
      method: 'post',
      path: '/auth/register',
      tag: 'auth',
      summary: 'Create an account (runner or coach) and sign in',
      access: 'public',
      body: RegisterInputSchema,
      response: UserResponseSchema,
      status: 201,
      before: [credentialLimiter],
    },
    async (req, res) => {
      const user = await registerUser(req.body, config);
      res.cookie(SESSION_COOKIE, signSession(user.id, config), sessionCookieOptions(config));
      res.status(201).json({ user: toUser(user) });
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
      before: [credentialLimiter],
    },
    async (req, res) => {
      const user = await checkCredentials(req.body, config);
      res.cookie(SESSION_COOKIE, signSession(user.id, config), sessionCookieOptions(config));
      res.json({ user: toUser(user) });
    },
  );

  api.route(
    {
      method: 'post',
      path: '/auth/logout',
      tag: 'auth',
      summary: 'Sign out (clears the session cookie)',
      access: 'public',
      status: 204,
    },
    (_req, res) => {
      const { maxAge: _maxAge, ...clearOptions } = sessionCookieOptions(config);
      res.clearCookie(SESSION_COOKIE, clearOptions);
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
      before: [credentialLimiter],
    },
    async (req, res) => {
      const user = await checkCredentials(req.body, config);
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
      response: z.object({ tokens: z.array(ApiTokenSchema) }),
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
      summary: 'Create a named API token while signed in (shown once)',
      access: 'own-data',
      body: NamedTokenInputSchema,
      response: TokenResponseSchema,
      status: 201,
    },
    async (req, res) => {
      res.status(201).json(await issueApiToken(requireActor(res).id, req.body.name, config));
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/auth/tokens/:id',
      tag: 'auth',
      summary: 'Revoke one of your API tokens',
      access: 'own-data',
      status: 204,
    },
    async (req, res) => {
      await revokeToken(requireActor(res).id, parseIdParam(req.params.id));
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
      status: 202,
      before: [credentialLimiter],
    },
    async (req, res) => {
      await requestPasswordReset(req.body.email, mailer, config);
      res.status(202).json({ message: 'If that address has an account, a link to choose a new password is on its way.' });
    },
  );

  api.route(
    {
      method: 'post',
      path: '/auth/password-reset/:token',
      tag: 'auth',
      summary: 'Choose a new password with a reset link; 400 forged, 410 used or expired',
      access: 'public',
      body: PasswordResetInputSchema,
      status: 204,
      before: [credentialLimiter],
    },
    async (req, res) => {
      await resetPassword(typeof req.params.token === 'string' ? req.params.token : '', req.body.password, config);
      res.status(204).end();
    },
  );

  return api;
}
