import { z } from 'zod';
import {
  AdminUserSchema,
  ChangeRoleInputSchema,
  ProfileSchema,
  UpdateProfileInputSchema,
  UserSchema,
} from '../../../shared/users/schemas.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { requireActor } from '../../lib/authorize.ts';
import { parseIdParam } from '../../lib/ids.ts';
import { toProfile } from './users.service.ts';
import { changeRole, listAllUsers, updateProfile } from './users.service.ts';

export function createUsersRouter() {
  const api = createApiRouter();
  const ProfileResponseSchema = z.object({ profile: ProfileSchema });

  api.route(
    {
      method: 'get',
      path: '/me',
      tag: 'profile',
      summary: "The signed-in user's profile",
      access: 'own-data',
      response: ProfileResponseSchema,
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
      response: ProfileResponseSchema,
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
      response: z.object({ users: z.array(AdminUserSchema) }),
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
      response: z.object({ user: UserSchema }),
    },
    async (req, res) => {
      res.json({ user: await changeRole(req.params.id, req.body.role) });
    },
  );

  return api;
}
