import { readTokenParam } from '../../lib/ids.ts';
import express, { type RequestHandler } from 'express';
import multer from 'multer';
import {
  NoticeSwitchesAnswerSchema,
  OneClickUnsubscribeBodySchema,
  UnsubscribeAnswerSchema,
  UpdateNoticeSwitchesInputSchema,
} from '../../../shared/notices/schemas.ts';
import type { AppConfig } from '../../config.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { requireActor } from '../../lib/authorize.ts';
import { BadRequestError } from '../../lib/errors.ts';
import { changeNoticeSwitches, describeUnsubscribeLink, noticeSwitchesOf, unsubscribeByLink } from './unsubscribe.service.ts';

/**
 * RFC 8058 §3.2: the one-click body is `application/x-www-form-urlencoded` or `multipart/form-data`;
 * our own page sends JSON. Each is parsed with a small limit (the body is one short pair).
 */
const oneClickBody: RequestHandler[] = [
  express.urlencoded({ extended: false, limit: '2kb', parameterLimit: 5 }),
  (req, res, next) => {
    multer({ limits: { fields: 5, fieldSize: 200, files: 0, parts: 5 } }).none()(req, res, (err: unknown) =>
      err ? next(new BadRequestError('Send List-Unsubscribe=One-Click to turn this notice off.')) : next(),
    );
  },
];

export function createNoticesRouter(config: AppConfig) {
  const api = createApiRouter();

  api.route(
    {
      method: 'get',
      path: '/me/notices',
      tag: 'notices',
      summary: 'Which notice e-mails the signed-in user gets (one switch per kind)',
      access: 'own-data',
      response: NoticeSwitchesAnswerSchema,
    },
    async (_req, res) => {
      res.json({ switches: await noticeSwitchesOf(requireActor(res).id) });
    },
  );

  api.route(
    {
      method: 'patch',
      path: '/me/notices',
      tag: 'notices',
      summary: 'Switch kinds of notice e-mails on or off',
      access: 'own-data',
      body: UpdateNoticeSwitchesInputSchema,
      response: NoticeSwitchesAnswerSchema,
    },
    async (req, res) => {
      res.json({ switches: await changeNoticeSwitches(requireActor(res).id, req.body) });
    },
  );

  api.route(
    {
      method: 'get',
      path: '/notices/unsubscribe/:token',
      tag: 'notices',
      summary: 'What an unsubscribe link switches off and whether it is on now (no sign-in; the link is signed)',
      access: 'public',
      params: { token: readTokenParam },
      response: UnsubscribeAnswerSchema,
    },
    async (req, res) => {
      res.json(await describeUnsubscribeLink(req.params.token, config));
    },
  );

  api.route(
    {
      method: 'post',
      path: '/notices/unsubscribe/:token',
      tag: 'notices',
      summary: 'One-click unsubscribe (RFC 8058): body List-Unsubscribe=One-Click turns off exactly the kind the link names',
      access: 'public',
      params: { token: readTokenParam },
      body: OneClickUnsubscribeBodySchema,
      response: UnsubscribeAnswerSchema,
      before: oneClickBody,
    },
    async (req, res) => {
      res.json(await unsubscribeByLink(req.params.token, config));
    },
  );

  return api;
}
