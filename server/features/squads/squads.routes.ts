import { z } from 'zod';
import {
  CreateSquadInputSchema,
  InvitationPreviewSchema,
  InvitationSchema,
  InviteInputSchema,
  SquadDetailSchema,
  SquadSchema,
} from '../../../shared/squads/schemas.ts';
import type { AppConfig } from '../../config.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { requireActor } from '../../lib/authorize.ts';
import { parseIdParam } from '../../lib/ids.ts';
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

const tokenOf = (value: string | string[] | undefined) => (typeof value === 'string' ? value : '');

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
      response: z.object({ squad: SquadSchema }),
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
      response: z.object({ squads: z.array(SquadDetailSchema) }),
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
      body: InviteInputSchema,
      response: z.object({ invitation: InvitationSchema }),
      status: 201,
    },
    async (req, res) => {
      res
        .status(201)
        .json({ invitation: await inviteRunner(requireActor(res), parseIdParam(req.params.id), req.body.email, mailer, config) });
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/squads/:id/invitations/:invitationId',
      tag: 'squads',
      summary: 'Withdraw an open invitation',
      access: 'squads:manage',
      status: 204,
    },
    async (req, res) => {
      await withdrawInvitation(requireActor(res), parseIdParam(req.params.id), parseIdParam(req.params.invitationId));
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
      status: 204,
    },
    async (req, res) => {
      await removeFromSquad(requireActor(res), parseIdParam(req.params.id), parseIdParam(req.params.runnerId), {
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
      response: InvitationPreviewSchema,
    },
    async (req, res) => {
      res.json(await previewInvitation(tokenOf(req.params.token)));
    },
  );

  api.route(
    {
      method: 'post',
      path: '/invitations/:token/accept',
      tag: 'squads',
      summary: 'Accept an invitation (signed in as a runner); 410 when used, withdrawn or expired',
      access: 'own-data',
      response: z.object({ squad: SquadSchema }),
    },
    async (req, res) => {
      res.json({ squad: await acceptInvitation(requireActor(res), tokenOf(req.params.token)) });
    },
  );

  api.route(
    {
      method: 'get',
      path: '/me/coaches',
      tag: 'squads',
      summary: 'The coaches who can read your data, and the squads that give them access',
      access: 'own-data',
      response: z.object({
        coaches: z.array(
          z.object({ squad: SquadSchema, coach: z.object({ id: z.string(), name: z.string(), email: z.string() }) }),
        ),
      }),
    },
    async (_req, res) => {
      res.json({ coaches: await coachesOf(requireActor(res)) });
    },
  );

  return api;
}
