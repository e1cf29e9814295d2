import { z } from 'zod';
import {
  GoalRaceAnswerSchema,
  GoalRaceInputSchema,
  RaceResultAnswerSchema,
  RaceResultInputSchema,
  RaceResultListAnswerSchema,
  SavedGoalRaceAnswerSchema,
} from '../../../shared/goals/schemas.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { requireActor } from '../../lib/authorize.ts';
import { NotFoundError } from '../../lib/errors.ts';
import { parseIdParam } from '../../lib/ids.ts';
import { assertCanReadRunner } from '../squads/index.ts';
import { findGoalRace, listRaceResults, toGoalRace, toRaceResult } from './goal-reads.service.ts';
import { deleteGoalRace, deleteRaceResult } from './goals.repository.ts';
import { addRaceResult, setGoalRace } from './goals.service.ts';

const RunnerQuerySchema = z.object({ runner_id: z.uuid({ error: 'Not a runner id.' }).optional() });

export function createGoalsRouter() {
  const api = createApiRouter();

  api.route(
    {
      method: 'get',
      path: '/me/goal-race',
      tag: 'goals',
      summary: 'The goal race (yours, or a squad runner’s with runner_id)',
      access: 'own-data',
      query: RunnerQuerySchema,
      response: GoalRaceAnswerSchema,
    },
    async (_req, res) => {
      const actor = requireActor(res);
      const { runner_id: runnerId = actor.id } = res.locals.query;
      await assertCanReadRunner(actor, runnerId);
      const row = await findGoalRace(runnerId);
      res.json({ goal_race: row ? toGoalRace(row) : null });
    },
  );

  api.route(
    {
      method: 'put',
      path: '/me/goal-race',
      tag: 'goals',
      summary: 'Set your goal race: name, date (today or later), distance and goal time',
      access: 'own-data',
      body: GoalRaceInputSchema,
      response: SavedGoalRaceAnswerSchema,
    },
    async (req, res) => {
      res.json({ goal_race: toGoalRace(await setGoalRace(requireActor(res), req.body)) });
    },
  );

  api.route(
    { method: 'delete', path: '/me/goal-race', tag: 'goals', summary: 'Clear your goal race', access: 'own-data', status: 204 },
    async (_req, res) => {
      if (!(await deleteGoalRace(requireActor(res).id))) throw new NotFoundError('You have no goal race set.');
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'get',
      path: '/me/race-results',
      tag: 'goals',
      summary: 'Race results, newest first (yours, or a squad runner’s with runner_id)',
      access: 'own-data',
      query: RunnerQuerySchema,
      response: RaceResultListAnswerSchema,
    },
    async (_req, res) => {
      const actor = requireActor(res);
      const { runner_id: runnerId = actor.id } = res.locals.query;
      await assertCanReadRunner(actor, runnerId);
      res.json({ results: (await listRaceResults(runnerId)).map(toRaceResult) });
    },
  );

  api.route(
    {
      method: 'post',
      path: '/me/race-results',
      tag: 'goals',
      summary: 'Add a race result: date (today or earlier), distance, time',
      access: 'own-data',
      body: RaceResultInputSchema,
      response: RaceResultAnswerSchema,
      status: 201,
    },
    async (req, res) => {
      res.status(201).json({ result: toRaceResult(await addRaceResult(requireActor(res), req.body)) });
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/me/race-results/:id',
      tag: 'goals',
      summary: 'Delete one of your race results',
      access: 'own-data',
      params: { id: parseIdParam },
      status: 204,
    },
    async (req, res) => {
      if (!(await deleteRaceResult(requireActor(res).id, req.params.id)))
        throw new NotFoundError('There is no such race result.');
      res.status(204).end();
    },
  );

  return api;
}
