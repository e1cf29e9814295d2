import {
  CoachAccessListAnswerSchema,
  CreateSquadInputSchema,
  InvitationAnswerSchema,
  InvitationPreviewSchema,
  InviteInputSchema,
  SquadAnswerSchema,
  SquadListAnswerSchema,
} from '../../../shared/squads/schemas.ts';
import type { AppConfig } from '../../config.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { requireActor } from '../../lib/authorize.ts';
import { parseIdParam, readTokenParam } from '../../lib/ids.ts';
import type { Mailer } from '../../lib/mailer.ts';
import {
  acceptInvitation,
  coachesOf,
  createSquad,
  inviteRunner,
  listMySquads,
  previewInvitation,
  removeFromSquad,
  withdrawInvitation,
} from './squads.service.ts';

export function createSquadsRouter(mailer: Mailer, config: AppConfig) {
  const api = createApiRouter();

  api.route(
    {
      method: 'post',
      path: '/squads',
      tag: 'squads',
      summary: 'Create a squad (coaches)',
      access: 'squads:manage',
      body: CreateSquadInputSchema,
      response: SquadAnswerSchema,
      status: 201,
    },
    async (req, res) => {
      res.status(201).json({ squad: await createSquad(requireActor(res), req.body.name) });
    },
  );

  api.route(
    {
      method: 'get',
      path: '/squads',
      tag: 'squads',
      summary: 'Squads you coach (with members and invitations) or belong to',
      access: 'own-data',
      response: SquadListAnswerSchema,
    },
    async (_req, res) => {
      res.json({ squads: await listMySquads(requireActor(res)) });
    },
  );

  api.route(
    {
      method: 'post',
      path: '/squads/:id/invitations',
      tag: 'squads',
      summary: 'Invite a runner by e-mail: a single-use link valid 14 days',
      access: 'squads:manage',
      params: { id: parseIdParam },
      body: InviteInputSchema,
      response: InvitationAnswerSchema,
      status: 201,
    },
    async (req, res) => {
      res.status(201).json({ invitation: await inviteRunner(requireActor(res), req.params.id, req.body.email, mailer, config) });
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/squads/:id/invitations/:invitationId',
      tag: 'squads',
      summary: 'Withdraw an open invitation',
      access: 'squads:manage',
      params: { id: parseIdParam, invitationId: parseIdParam },
      status: 204,
    },
    async (req, res) => {
      await withdrawInvitation(requireActor(res), req.params.id, req.params.invitationId);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/squads/:id/members/:runnerId',
      tag: 'squads',
      summary: 'Remove a runner (the coach) or leave the squad (the runner, with their own id)',
      access: 'own-data',
      params: { id: parseIdParam, runnerId: parseIdParam },
      status: 204,
    },
    async (req, res) => {
      await removeFromSquad(requireActor(res), req.params.id, req.params.runnerId, {
        mailer,
        config,
      });
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'get',
      path: '/invitations/:token',
      tag: 'squads',
      summary: 'What an invitation is for (squad, coach, status), for the invite page',
      access: 'public',
      params: { token: readTokenParam },
      response: InvitationPreviewSchema,
    },
    async (req, res) => {
      res.json(await previewInvitation(req.params.token));
    },
  );

  api.route(
    {
      method: 'post',
      path: '/invitations/:token/accept',
      tag: 'squads',
      summary: 'Accept an invitation (signed in as a runner); 410 when used, withdrawn or expired',
      access: 'own-data',
      params: { token: readTokenParam },
      response: SquadAnswerSchema,
    },
    async (req, res) => {
      res.json({ squad: await acceptInvitation(requireActor(res), req.params.token) });
    },
  );

  api.route(
    {
      method: 'get',
      path: '/me/coaches',
      tag: 'squads',
      summary: 'The coaches who can read your data, and the squads that give them access',
      access: 'own-data',
      response: CoachAccessListAnswerSchema,
    },
    async (_req, res) => {
      res.json({ coaches: await coachesOf(requireActor(res)) });
    },
  );

  return api;
}
