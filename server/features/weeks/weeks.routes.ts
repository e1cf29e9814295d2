import { CSV } from '../../../shared/api/media-types.ts';
import { z } from 'zod';
import { NewRunNoteInputSchema } from '../../../shared/runs/schemas.ts';
import { overviewToCsv, weekToCsv } from '../../../shared/weeks/csv.ts';
import { calendarDateSchema } from '../../../shared/api/calendar-date.ts';
import { AddedWeekNoteAnswerSchema, RunnerWeekSchema } from '../../../shared/weeks/week-answer.ts';
import { DigestReceiptSchema, SquadOverviewSchema } from '../../../shared/weeks/squad-overview.ts';
import type { AppConfig } from '../../config.ts';
import { createApiRouter, sendReadyJson } from '../../lib/api-router.ts';
import { requireActor } from '../../lib/authorize.ts';
import { BadRequestError } from '../../lib/errors.ts';
import { parseIdParam } from '../../lib/ids.ts';
import type { Mailer } from '../../lib/mailer.ts';
import { sendSquadDigest } from './digest.service.ts';
import { addWeekNote, buildRunnerWeek, buildSquadOverview, readyRunnerWeek, setWeekReviewed } from './weeks.service.ts';

const DateSchema = calendarDateSchema();
const WeekQuerySchema = z.object({ start: DateSchema.optional() });
const OverviewQuerySchema = z.object({ week: DateSchema.optional() });

function weekParam(value: string | string[] | undefined): string {
  const parsed = DateSchema.safeParse(value);
  if (!parsed.success) throw new BadRequestError(parsed.error.issues[0]?.message ?? 'Use a week start date like 2026-11-23.');
  return parsed.data;
}

export function createWeeksRouter(mailer: Mailer, config: AppConfig) {
  const api = createApiRouter();

  api.route(
    {
      method: 'get',
      path: '/runners/:id/week',
      reads: 'replica',
      tag: 'weeks',
      summary: 'One runner’s week (start = any date in it): plans and runs with verdicts, totals, load, flags, notes',
      access: 'own-data',
      params: { id: parseIdParam },
      query: WeekQuerySchema,
      response: RunnerWeekSchema,
    },
    async (req, res) => {
      const { start } = res.locals.query;
      sendReadyJson(res, await readyRunnerWeek(requireActor(res), req.params.id, start));
    },
  );

  api.route(
    {
      method: 'get',
      path: '/runners/:id/week.csv',
      file: [CSV],
      tag: 'weeks',
      summary: 'The week as CSV',
      access: 'own-data',
      params: { id: parseIdParam },
      query: WeekQuerySchema,
    },
    async (req, res) => {
      const { start } = res.locals.query;
      const week = await buildRunnerWeek(requireActor(res), req.params.id, start);
      res.type('text/csv; charset=utf-8').attachment(`week-${week.start}.csv`).send(weekToCsv(week.days));
    },
  );

  api.route(
    {
      method: 'post',
      path: '/runners/:id/weeks/:start/notes',
      response: AddedWeekNoteAnswerSchema,
      tag: 'weeks',
      summary: 'Write a note on a week (the runner or their coach)',
      access: 'own-data',
      params: { id: parseIdParam, start: weekParam },
      body: NewRunNoteInputSchema,
      status: 201,
    },
    async (req, res) => {
      res.status(201).json({
        note: await addWeekNote(requireActor(res), req.params.id, req.params.start, req.body.text, req.body.concern ?? null, {
          mailer,
          config,
        }),
      });
    },
  );

  api.route(
    {
      method: 'put',
      path: '/runners/:id/weeks/:start/review',
      tag: 'weeks',
      summary: 'Mark the week reviewed (reviewed: true) or not (false) — the runner’s coach',
      access: 'squads:manage',
      params: { id: parseIdParam, start: weekParam },
      body: z.object({ reviewed: z.boolean({ error: 'Say reviewed: true or false.' }) }).strict(),
      status: 204,
    },
    async (req, res) => {
      await setWeekReviewed(requireActor(res), req.params.id, req.params.start, req.body.reviewed);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'get',
      path: '/squads/:id/overview',
      reads: 'replica',
      tag: 'weeks',
      summary: 'One row per squad runner for a week: planned and run, sessions, flags, last upload, reviewed, 12-week volume',
      access: 'squads:manage',
      params: { id: parseIdParam },
      query: OverviewQuerySchema,
      response: SquadOverviewSchema,
    },
    async (req, res) => {
      const { week } = res.locals.query;
      res.json(await buildSquadOverview(requireActor(res), req.params.id, week));
    },
  );

  api.route(
    {
      method: 'get',
      path: '/squads/:id/overview.csv',
      file: [CSV],
      tag: 'weeks',
      summary: 'The squad overview as CSV',
      access: 'squads:manage',
      params: { id: parseIdParam },
      query: OverviewQuerySchema,
    },
    async (req, res) => {
      const { week } = res.locals.query;
      const overview = await buildSquadOverview(requireActor(res), req.params.id, week);
      res
        .type('text/csv; charset=utf-8')
        .attachment(`squad-${overview.rows[0]?.start ?? 'week'}.csv`)
        .send(overviewToCsv(overview.rows));
    },
  );

  api.route(
    {
      method: 'post',
      path: '/squads/:id/digest',
      tag: 'weeks',
      summary: 'E-mail the weekly digest of this squad to its coach now',
      access: 'squads:manage',
      params: { id: parseIdParam },
      body: z.object({ week: DateSchema.optional() }).strict(),
      response: DigestReceiptSchema,
    },
    async (req, res) => {
      res.json(await sendSquadDigest(requireActor(res), req.params.id, req.body.week, mailer, config));
    },
  );

  return api;
}
