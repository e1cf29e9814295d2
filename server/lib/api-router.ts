import { Router, type RequestHandler } from 'express';
import type { z } from 'zod';
import type { Permission } from '../../shared/auth/permissions.ts';
import { authorize } from './authorize.ts';
import { replicaReads } from './read-replica.ts';
import { validate } from './validate.ts';

type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';

/** One route's description: it both wires the route and documents it in /api/openapi.json. */
export interface RouteSpec {
  method: Method;
  /** Express path relative to /api, e.g. `/auth/login` or `/admin/users/:id`. */
  path: string;
  summary: string;
  tag: string;
  /** Who may call it — the only place a route says so (see shared/auth/permissions.ts). */
  access: Permission | 'public';
  body?: z.ZodType;
  query?: z.ZodType;
  /** Response body for the success status. */
  response?: z.ZodType;
  status?: number;
  /** Middleware that runs before validation, e.g. a rate limiter. */
  before?: RequestHandler[];
  /**
   * `replica`: a read-only page whose `readDb()` reads a streaming read replica may serve (server/lib/read-replica.ts).
   * Writes in its handler (marking notes read, storing results) still go to the primary through `db`.
   */
  reads?: 'replica';
}

export interface ApiRouter {
  router: Router;
  specs: RouteSpec[];
  route(spec: RouteSpec, handler: RequestHandler): void;
}

/** A feature's router: every route passes through `authorize` and `validate` with its shared schemas. */
export function createApiRouter(): ApiRouter {
  const router = Router();
  const specs: RouteSpec[] = [];
  return {
    router,
    specs,
    route(spec, handler) {
      specs.push(spec);
      router[spec.method](
        spec.path,
        ...(spec.before ?? []),
        authorize(spec.access),
        validate(spec),
        spec.reads === 'replica' ? replicaReads(handler) : handler,
      );
    },
  };
}
