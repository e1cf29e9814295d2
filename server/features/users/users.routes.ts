import {
  AdminUserListAnswerSchema,
  ChangeRoleInputSchema,
  ProfileAnswerSchema,
  UpdateProfileInputSchema,
} from '../../../shared/users/schemas.ts';
import { UserResponseSchema } from '../../../shared/auth/schemas.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { requireActor } from '../../lib/authorize.ts';
import { parseIdParam } from '../../lib/ids.ts';
import { changeRole, listAllUsers, toProfile, updateProfile } from './users.service.ts';

export function createUsersRouter() {
  const api = createApiRouter();

  api.route(
    {
      method: 'get',
      path: '/me',
      tag: 'profile',
      summary: "The signed-in user's profile",
      access: 'own-data',
      response: ProfileAnswerSchema,
    },
    (_req, res) => {
      res.json({ profile: toProfile(requireActor(res)) });
    },
  );

  api.route(
    {
      method: 'patch',
      path: '/me',
      tag: 'profile',
      summary: 'Change name, units, birth year, heart rates, weight or time zone',
      access: 'own-data',
      body: UpdateProfileInputSchema,
      response: ProfileAnswerSchema,
    },
    async (req, res) => {
      res.json({ profile: await updateProfile(requireActor(res).id, req.body) });
    },
  );

  api.route(
    {
      method: 'get',
      path: '/admin/users',
      tag: 'admin',
      summary: 'Every user with their role (admins)',
      access: 'users:manage',
      response: AdminUserListAnswerSchema,
    },
    async (_req, res) => {
      res.json({ users: await listAllUsers() });
    },
  );

  api.route(
    {
      method: 'patch',
      path: '/admin/users/:id',
      tag: 'admin',
      summary: "Change a user's role (admins)",
      access: 'users:manage',
      params: { id: parseIdParam },
      body: ChangeRoleInputSchema,
      response: UserResponseSchema,
    },
    async (req, res) => {
      res.json({ user: await changeRole(req.params.id, req.body.role) });
    },
  );

  return api;
}
