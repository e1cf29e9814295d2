import {
  CheckinViewSchema,
  FuelPlanAnswerSchema,
  FuelTakenViewSchema,
  SavedFuelPlanAnswerSchema,
} from '../../../shared/fuel/answers.ts';
import { z } from 'zod';
import {
  CheckinInputSchema,
  FuelItemAnswerSchema,
  FuelItemInputSchema,
  FuelItemListAnswerSchema,
  FuelItemPatchSchema,
  FuelPlanInputSchema,
  FuelTakenInputSchema,
} from '../../../shared/fuel/schemas.ts';
import type { AppConfig } from '../../config.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import type { Mailer } from '../../lib/mailer.ts';
import { requireActor } from '../../lib/authorize.ts';
import { parseIdParam } from '../../lib/ids.ts';
import {
  changeItem,
  createItem,
  getCheckin,
  getFuelTaken,
  getGoalFuelPlan,
  getPlanFuelPlan,
  listItemsOf,
  putCheckin,
  putFuelTaken,
  putGoalFuelPlan,
  putPlanFuelPlan,
  removeGoalFuelPlan,
  removeItem,
  removePlanFuelPlan,
} from './fuel.service.ts';

const RunnerQuerySchema = z.object({ runner_id: z.uuid({ error: 'Not a runner id.' }).optional() });

export function createFuelRouter(mailer: Mailer, config: AppConfig) {
  const api = createApiRouter();

  api.route(
    {
      method: 'get',
      path: '/fuel-items',
      tag: 'fuel',
      summary: 'Fuel items (yours, or a squad runner’s with runner_id)',
      access: 'own-data',
      query: RunnerQuerySchema,
      response: FuelItemListAnswerSchema,
    },
    async (_req, res) => {
      const actor = requireActor(res);
      const { runner_id: runnerId = actor.id } = res.locals.query;
      res.json({ items: await listItemsOf(actor, runnerId) });
    },
  );

  api.route(
    {
      method: 'post',
      path: '/fuel-items',
      tag: 'fuel',
      summary: 'Add a fuel item: name, serving, and carbohydrate g, sodium mg, caffeine mg, fluid ml per serving',
      access: 'own-data',
      body: FuelItemInputSchema,
      response: FuelItemAnswerSchema,
      status: 201,
    },
    async (req, res) => {
      res.status(201).json({ item: await createItem(requireActor(res), req.body) });
    },
  );

  api.route(
    {
      method: 'patch',
      path: '/fuel-items/:id',
      tag: 'fuel',
      summary: 'Change one of your fuel items',
      access: 'own-data',
      params: { id: parseIdParam },
      body: FuelItemPatchSchema,
      response: FuelItemAnswerSchema,
    },
    async (req, res) => {
      res.json({ item: await changeItem(requireActor(res), req.params.id, req.body) });
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/fuel-items/:id',
      tag: 'fuel',
      summary: 'Delete one of your fuel items',
      access: 'own-data',
      params: { id: parseIdParam },
      status: 204,
    },
    async (req, res) => {
      await removeItem(requireActor(res), req.params.id);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'get',
      path: '/plans/:id/fuel-plan',
      response: FuelPlanAnswerSchema,
      tag: 'fuel',
      summary:
        'A session plan’s fuel plan: schedule by mile, km and clock, hourly totals vs targets with sources, meals, cautions',
      access: 'own-data',
      params: { id: parseIdParam },
    },
    async (req, res) => {
      res.json({ fuel_plan: await getPlanFuelPlan(requireActor(res), req.params.id) });
    },
  );

  api.route(
    {
      method: 'put',
      path: '/plans/:id/fuel-plan',
      response: SavedFuelPlanAnswerSchema,
      tag: 'fuel',
      summary: 'Set a session plan’s fuel plan (the runner or their coach); computes and stores the schedule',
      access: 'own-data',
      params: { id: parseIdParam },
      body: FuelPlanInputSchema,
    },
    async (req, res) => {
      res.json({ fuel_plan: await putPlanFuelPlan(requireActor(res), req.params.id, req.body) });
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/plans/:id/fuel-plan',
      tag: 'fuel',
      summary: 'Remove a session plan’s fuel plan',
      access: 'own-data',
      params: { id: parseIdParam },
      status: 204,
    },
    async (req, res) => {
      await removePlanFuelPlan(requireActor(res), req.params.id);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'get',
      path: '/me/goal-race/fuel-plan',
      response: FuelPlanAnswerSchema,
      tag: 'fuel',
      summary: 'The goal race’s fuel plan (yours, or a squad runner’s with runner_id)',
      access: 'own-data',
      query: RunnerQuerySchema,
    },
    async (_req, res) => {
      const actor = requireActor(res);
      const { runner_id: runnerId = actor.id } = res.locals.query;
      res.json({ fuel_plan: await getGoalFuelPlan(actor, runnerId) });
    },
  );

  api.route(
    {
      method: 'put',
      path: '/me/goal-race/fuel-plan',
      response: SavedFuelPlanAnswerSchema,
      tag: 'fuel',
      summary: 'Set the goal race’s fuel plan, timed by the goal time (a coach adds runner_id)',
      access: 'own-data',
      query: RunnerQuerySchema,
      body: FuelPlanInputSchema,
    },
    async (req, res) => {
      const actor = requireActor(res);
      const { runner_id: runnerId = actor.id } = res.locals.query;
      res.json({ fuel_plan: await putGoalFuelPlan(actor, runnerId, req.body) });
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/me/goal-race/fuel-plan',
      tag: 'fuel',
      summary: 'Remove the goal race’s fuel plan (a coach adds runner_id)',
      access: 'own-data',
      query: RunnerQuerySchema,
      status: 204,
    },
    async (_req, res) => {
      const actor = requireActor(res);
      const { runner_id: runnerId = actor.id } = res.locals.query;
      await removeGoalFuelPlan(actor, runnerId);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'get',
      path: '/runs/:id/fuel-taken',
      response: FuelTakenViewSchema,
      tag: 'fuel',
      summary: 'What was taken on a run, how it went, and planned vs taken per hour when the run’s plan has a fuel plan',
      access: 'own-data',
      params: { id: parseIdParam },
    },
    async (req, res) => {
      res.json(await getFuelTaken(requireActor(res), req.params.id));
    },
  );

  api.route(
    {
      method: 'put',
      path: '/runs/:id/fuel-taken',
      response: FuelTakenViewSchema,
      tag: 'fuel',
      summary: 'Record what you took on your run (items with servings and times, water) and stomach and energy 1–5',
      access: 'own-data',
      params: { id: parseIdParam },
      body: FuelTakenInputSchema,
    },
    async (req, res) => {
      res.json(await putFuelTaken(requireActor(res), req.params.id, req.body));
    },
  );

  api.route(
    {
      method: 'get',
      path: '/runs/:id/checkin',
      response: CheckinViewSchema,
      tag: 'fuel',
      summary: 'The after-run check-in: sleep, soreness, mood, recovery work; cold-water immersion with its caution',
      access: 'own-data',
      params: { id: parseIdParam },
    },
    async (req, res) => {
      res.json(await getCheckin(requireActor(res), req.params.id));
    },
  );

  api.route(
    {
      method: 'put',
      path: '/runs/:id/checkin',
      response: CheckinViewSchema,
      tag: 'fuel',
      summary: 'Record your after-run check-in',
      access: 'own-data',
      params: { id: parseIdParam },
      body: CheckinInputSchema,
    },
    async (req, res) => {
      res.json(await putCheckin(requireActor(res), req.params.id, req.body, { mailer, config }));
    },
  );

  return api;
}
