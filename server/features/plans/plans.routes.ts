import { CSV } from '../../../shared/api/media-types.ts';
import { z } from 'zod';
import {
  CreatePlanInputSchema,
  ParsePlanInputSchema,
  ParsedPlanSchema,
  PlanAnswerSchema,
  PlanDateSchema,
  PlanListAnswerSchema,
  UpdatePlanInputSchema,
} from '../../../shared/plans/schemas.ts';
import { PaceToleranceSchema } from '../../../shared/users/schemas.ts';
import { PaceToleranceAnswerSchema } from '../../../shared/plans/prescribe-schemas.ts';
import type { AppConfig } from '../../config.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { authorize, requireActor } from '../../lib/authorize.ts';
import { perUserRateLimit } from '../../lib/per-user-rate-limit.ts';
import { parseIdParam } from '../../lib/ids.ts';
import { PlanCheckAnswerSchema } from '../../../shared/plans/plan-check-answer.ts';
import { planCheckToCsv } from '../../../shared/plans/plan-check-csv.ts';
import {
  changePlan,
  createPlan,
  getPlan,
  linkRunToPlan,
  listPlansFor,
  parsePlanText,
  planCheckOfRun,
  removePlan,
  setPaceTolerance,
} from './plans.service.ts';

const ListPlansQuerySchema = z.object({
  from: PlanDateSchema.optional(),
  to: PlanDateSchema.optional(),
  runner_id: z.uuid({ error: 'Not a runner id.' }).optional(),
});

const LinkPlanInputSchema = z
  .object({ plan_id: z.union([z.uuid({ error: 'Not a plan id.' }), z.null(), z.literal('auto')]) })
  .strict();

export function createPlansRouter(config: AppConfig) {
  const api = createApiRouter();

  api.route(
    {
      method: 'post',
      path: '/plans/parse',
      response: ParsedPlanSchema,
      tag: 'plans',
      summary: 'Parse session shorthand: 200 with parts, or 400 with details {position, expected}',
      access: 'own-data',
      body: ParsePlanInputSchema,
    },
    (req, res) => {
      res.json(parsePlanText(req.body.text));
    },
  );

  api.route(
    {
      method: 'post',
      path: '/plans',
      tag: 'plans',
      summary: 'Create a session plan from shorthand (text) or parts; a coach may add runner_id for a squad runner',
      access: 'own-data',
      body: CreatePlanInputSchema,
      response: PlanAnswerSchema,
      status: 201,
    },
    async (req, res) => {
      res.status(201).json({ plan: await createPlan(requireActor(res), req.body) });
    },
  );

  api.route(
    {
      method: 'get',
      path: '/plans',
      tag: 'plans',
      summary: 'Session plans between two dates (yours, or a squad runner’s with runner_id)',
      access: 'own-data',
      query: ListPlansQuerySchema,
      response: PlanListAnswerSchema,
    },
    async (_req, res) => {
      res.json({ plans: await listPlansFor(requireActor(res), res.locals.query) });
    },
  );

  api.route(
    {
      method: 'get',
      path: '/plans/:id',
      tag: 'plans',
      summary: 'One session plan',
      access: 'own-data',
      params: { id: parseIdParam },
      response: PlanAnswerSchema,
    },
    async (req, res) => {
      res.json({ plan: await getPlan(requireActor(res), req.params.id) });
    },
  );

  api.route(
    {
      method: 'patch',
      path: '/plans/:id',
      tag: 'plans',
      summary: 'Change a plan: move it to another date, retitle it, rewrite it',
      access: 'own-data',
      params: { id: parseIdParam },
      body: UpdatePlanInputSchema,
      response: PlanAnswerSchema,
    },
    async (req, res) => {
      res.json({ plan: await changePlan(requireActor(res), req.params.id, req.body) });
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/plans/:id',
      tag: 'plans',
      summary: 'Delete a plan',
      access: 'own-data',
      params: { id: parseIdParam },
      status: 204,
    },
    async (req, res) => {
      await removePlan(requireActor(res), req.params.id);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'get',
      path: '/runs/:id/plan-check',
      tag: 'plans',
      summary: 'The run against its session plan, part by part, with verdicts',
      access: 'own-data',
      params: { id: parseIdParam },
      response: PlanCheckAnswerSchema,
    },
    async (req, res) => {
      res.json(await planCheckOfRun(requireActor(res), req.params.id));
    },
  );

  api.route(
    {
      method: 'get',
      path: '/runs/:id/plan-check.csv',
      file: [CSV],
      tag: 'plans',
      summary: 'The plan check as CSV',
      access: 'own-data',
      params: { id: parseIdParam },
    },
    async (req, res) => {
      const check = await planCheckOfRun(requireActor(res), req.params.id);
      res.type('text/csv; charset=utf-8').attachment('plan-check.csv').send(planCheckToCsv(check.parts));
    },
  );

  api.route(
    {
      method: 'put',
      path: '/runs/:id/plan',
      tag: 'plans',
      summary: 'Link your run to one of your plans (plan_id), to none (null), or back to the same-day plan ("auto")',
      access: 'own-data',
      params: { id: parseIdParam },
      body: LinkPlanInputSchema,
      status: 204,
    },
    async (req, res) => {
      await linkRunToPlan(requireActor(res), req.params.id, req.body.plan_id);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'put',
      path: '/runners/:id/pace-tolerance',
      tag: 'plans',
      summary: 'Set how far from the target pace still counts as on pace (the runner or their coach)',
      access: 'own-data',
      params: { id: parseIdParam },
      body: z.object({ pace_tolerance: PaceToleranceSchema }).strict(),
      response: PaceToleranceAnswerSchema,
      // Each change makes every stored plan check of the runner stale, to be recomputed on the next read.
      before: [
        authorize('own-data'),
        perUserRateLimit({
          name: 'pace-tolerance-changes',
          ...config.recomputeRateLimit,
          code: 'too-many-changes',
          message: `The pace tolerance can be changed ${config.recomputeRateLimit.max} times in ${Math.round(config.recomputeRateLimit.windowMs / 60_000)} minutes, as every change rechecks all runs against their plans. Please try again later.`,
        }),
      ],
    },
    async (req, res) => {
      res.json({
        pace_tolerance: await setPaceTolerance(requireActor(res), req.params.id, req.body.pace_tolerance),
      });
    },
  );

  return api;
}
