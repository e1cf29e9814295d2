import { z } from 'zod';
import {
  AssignInputSchema,
  AssignResultSchema,
  CopyWeekInputSchema,
  CreateLibrarySessionInputSchema,
  DayMarkAnswerSchema,
  DayMarkListAnswerSchema,
  LibrarySessionAnswerSchema,
  LibrarySessionListAnswerSchema,
  PlanBatchResultSchema,
  PlanChangesAnswerSchema,
  PutDayMarkInputSchema,
  RunnerSummaryAnswerSchema,
  UpdateLibrarySessionInputSchema,
} from '../../../shared/plans/prescribe-schemas.ts';
import { PlanDateSchema } from '../../../shared/plans/schemas.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { requireActor } from '../../lib/authorize.ts';
import { BadRequestError } from '../../lib/errors.ts';
import { parseIdParam } from '../../lib/ids.ts';
import {
  assignSession,
  changeLibrarySession,
  copyWeek,
  createLibrarySession,
  listChangesOfPlan,
  listDayMarks,
  listLibraryOf,
  putDayMark,
  removeDayMark,
  removeLibrarySession,
  runnerSummary,
  undoBatch,
} from './prescribe.service.ts';

const RunnerQuerySchema = z.object({ runner_id: z.uuid({ error: 'Not a runner id.' }).optional() }).strict();
const DayMarksQuerySchema = z
  .object({ from: PlanDateSchema, to: PlanDateSchema, runner_id: z.uuid({ error: 'Not a runner id.' }).optional() })
  .strict();

/** A `:date` path value: a real calendar date from 1900 to 2100, else 400 with the schema's sentence. */
function parseDateParam(value: string | string[] | undefined): string {
  const parsed = PlanDateSchema.safeParse(value);
  if (!parsed.success) throw new BadRequestError(parsed.error.issues[0]?.message ?? 'Use a date like 2026-10-03.', 'bad-date');
  return parsed.data;
}

/** Issue 15: the coach prescribes — copy a week, apply to several runners, undo, the library, day marks. */
export function createPrescribeRouter() {
  const api = createApiRouter();

  api.route(
    {
      method: 'post',
      path: '/plans/copy-week',
      tag: 'plans',
      summary:
        'Copy the seven days from from_start onto the seven days from to_start; a week with sessions needs mode "replace" or "add" (else 409, details.existing)',
      access: 'own-data',
      body: CopyWeekInputSchema,
      response: PlanBatchResultSchema,
      status: 201,
    },
    async (req, res) => {
      res.status(201).json(await copyWeek(requireActor(res), req.body));
    },
  );

  api.route(
    {
      method: 'post',
      path: '/plans/assign',
      tag: 'plans',
      summary: 'One session (shorthand or a library session) for 1–100 runners on a date, all or nothing',
      access: 'own-data',
      body: AssignInputSchema,
      response: AssignResultSchema,
      status: 201,
    },
    async (req, res) => {
      res.status(201).json(await assignSession(requireActor(res), req.body));
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/plans/batches/:id',
      tag: 'plans',
      summary: 'Undo a copied week or an applied library session (its author, within 24 hours)',
      access: 'own-data',
      params: { id: parseIdParam },
      status: 204,
    },
    async (req, res) => {
      await undoBatch(requireActor(res), req.params.id);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'get',
      path: '/plans/:id/changes',
      tag: 'plans',
      summary: 'Who changed a session, when and what, newest first',
      access: 'own-data',
      params: { id: parseIdParam },
      response: PlanChangesAnswerSchema,
    },
    async (req, res) => {
      res.json({ changes: await listChangesOfPlan(requireActor(res), req.params.id) });
    },
  );

  api.route(
    {
      method: 'get',
      path: '/library',
      tag: 'library',
      summary: 'Your session library',
      access: 'own-data',
      response: LibrarySessionListAnswerSchema,
    },
    async (_req, res) => {
      res.json({ sessions: await listLibraryOf(requireActor(res)) });
    },
  );

  api.route(
    {
      method: 'post',
      path: '/library',
      tag: 'library',
      summary: 'Keep a session under a name: {name, title?, text} or {name, plan_id} (with its fuel plan)',
      access: 'own-data',
      body: CreateLibrarySessionInputSchema,
      response: LibrarySessionAnswerSchema,
      status: 201,
    },
    async (req, res) => {
      res.status(201).json({ session: await createLibrarySession(requireActor(res), req.body) });
    },
  );

  api.route(
    {
      method: 'patch',
      path: '/library/:id',
      tag: 'library',
      summary: 'Rename or rewrite a library session',
      access: 'own-data',
      params: { id: parseIdParam },
      body: UpdateLibrarySessionInputSchema,
      response: LibrarySessionAnswerSchema,
    },
    async (req, res) => {
      res.json({ session: await changeLibrarySession(requireActor(res), req.params.id, req.body) });
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/library/:id',
      tag: 'library',
      summary: 'Delete a library session',
      access: 'own-data',
      params: { id: parseIdParam },
      status: 204,
    },
    async (req, res) => {
      await removeLibrarySession(requireActor(res), req.params.id);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'get',
      path: '/days',
      tag: 'plans',
      summary: 'Day marks (rest, ill, injured, cross-training) between two dates, yours or a squad runner’s',
      access: 'own-data',
      query: DayMarksQuerySchema,
      response: DayMarkListAnswerSchema,
    },
    async (_req, res) => {
      res.json({ day_marks: await listDayMarks(requireActor(res), res.locals.query) });
    },
  );

  api.route(
    {
      method: 'put',
      path: '/days/:date',
      tag: 'plans',
      summary: 'Mark a day rest, ill, injured or cross-training (minutes, note); a coach adds runner_id',
      access: 'own-data',
      params: { date: parseDateParam },
      body: PutDayMarkInputSchema,
      response: DayMarkAnswerSchema,
    },
    async (req, res) => {
      res.json({ day_mark: await putDayMark(requireActor(res), req.params.date, req.body) });
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/days/:date',
      tag: 'plans',
      summary: 'Remove a day mark (?runner_id= for a squad runner)',
      access: 'own-data',
      params: { date: parseDateParam },
      query: RunnerQuerySchema,
      status: 204,
    },
    async (req, res) => {
      const query = res.locals.query;
      await removeDayMark(requireActor(res), req.params.date, query.runner_id);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'get',
      path: '/runners/:id',
      tag: 'plans',
      summary: 'A runner’s name, unit and plan-check tolerance (the runner, their coaches, admins)',
      access: 'own-data',
      params: { id: parseIdParam },
      response: RunnerSummaryAnswerSchema,
    },
    async (req, res) => {
      res.json({ runner: await runnerSummary(requireActor(res), req.params.id) });
    },
  );

  return api;
}
