import { RunDetailSchema, RunPageSchema, RunTrackSchema } from '../../../shared/runs/types.ts';
import { ORIGINAL_CONTENT_TYPES } from '../../../shared/runs/original-download.ts';
import { CSV } from '../../../shared/api/media-types.ts';
import {
  ImportResultSchema,
  ListRunsQuerySchema,
  NewRunNoteInputSchema,
  RenameRunInputSchema,
  RunListItemAnswerSchema,
  RunNoteAnswerSchema,
  RunNoteListAnswerSchema,
  SplitsCsvQuerySchema,
  StorageUsageSchema,
  UploadRunsQuerySchema,
} from '../../../shared/runs/schemas.ts';
import { createApiRouter, sendReadyJson } from '../../lib/api-router.ts';
import { requireActor } from '../../lib/authorize.ts';
import { BadRequestError } from '../../lib/errors.ts';
import { parseIdParam } from '../../lib/ids.ts';
import type { FileStore } from '../../lib/storage.ts';
import type { AppConfig } from '../../config.ts';
import type { Mailer } from '../../lib/mailer.ts';
import { recordUploadNotice } from '../notices/index.ts';
import { logger } from '../../lib/logger.ts';
import {
  addNote,
  deleteOwnRun,
  describeRun,
  notesOf,
  importFiles,
  startArrivingImport,
  listRuns,
  originalFileOf,
  readyRunList,
  readyRunPage,
  renameOwnRun,
  splitsCsvOf,
  storageOf,
  trackOf,
} from './runs.service.ts';
import { uploadGuards, type StorageLocals } from './upload-guards.ts';
import { receiveUploads, receivedFiles, removeReceivedFiles, uploadsTempDir } from './upload-to-disk.ts';

/** Files per upload request; a whole history goes through the bulk import instead. */
const MAX_FILES_PER_UPLOAD = 20;

export function createRunsRouter(store: FileStore, config: AppConfig, mailer: Mailer) {
  const api = createApiRouter();

  api.route(
    {
      method: 'post',
      path: '/runs',
      tag: 'runs',
      summary:
        'Upload GPX/TCX files (also .gz) as multipart parts named "files"; 201 when at least one run was imported, else 422',
      access: 'own-data',
      query: UploadRunsQuerySchema,
      response: ImportResultSchema,
      status: 201,
      // Who is asking, and whether they may upload now, is settled before a byte of the body is read.
      before: [
        ...uploadGuards(config, { route: 'run-files', checkStorage: true }),
        receiveUploads({
          tempDir: uploadsTempDir(config.dataDir),
          maxFileBytes: config.uploadMaxFileBytes,
          maxRequestBytes: config.uploadMaxRequestBytes,
          maxFiles: MAX_FILES_PER_UPLOAD,
          storageLeft: (req) => (req.res?.locals as StorageLocals | undefined)?.storage,
          // The first file is read while it arrives when a compute thread is free (runs README).
          onArriving: (req, arriving, writer) => startArrivingImport(requireActor(req.res!), arriving, writer),
        }),
      ],
    },
    async (req, res) => {
      const files = receivedFiles(req);
      if (files.length === 0) throw new BadRequestError('Choose at least one .gpx or .tcx file to upload.', 'no-files');
      const actor = requireActor(res);
      const { duplicates } = res.locals.query;
      const result = await importFiles(actor, files, store, {
        storageQuotaBytes: config.storageQuotaBytes,
        importDuplicates: duplicates === 'import',
      });
      // Gone before the answer, so whoever reads it finds nothing of the upload left behind.
      await removeReceivedFiles(req);
      // The coaches hear of it once per upload batch (the page sends a request per file): queued, not sent here.
      await recordUploadNotice(
        actor.id,
        result.imported.map((r) => r.id),
      ).catch((err: unknown) => logger.error({ err }, 'recording an upload notice failed'));
      res.status(result.imported.length > 0 ? 201 : 422).json(result);
    },
  );

  api.route(
    {
      method: 'get',
      path: '/me/storage',
      tag: 'runs',
      summary: 'Storage used by your original files against your quota (STORAGE_QUOTA_MB)',
      access: 'own-data',
      response: StorageUsageSchema,
    },
    async (_req, res) => {
      res.json(await storageOf(requireActor(res), config.storageQuotaBytes));
    },
  );

  api.route(
    {
      method: 'get',
      path: '/runs',
      reads: 'replica',
      tag: 'runs',
      summary:
        'List runs, paged, newest first unless sort (date|distance|duration|pace) and order (asc|desc) say otherwise; optionally between local dates (from/to) and for a squad runner (runner_id)',
      access: 'own-data',
      query: ListRunsQuerySchema,
      response: RunPageSchema,
    },
    async (_req, res) => {
      const actor = requireActor(res);
      const { inputsCounter } = res.locals;
      if (inputsCounter) sendReadyJson(res, await readyRunList(actor, inputsCounter, res.locals.query));
      else res.json(await listRuns(actor, res.locals.query));
    },
  );

  api.route(
    {
      method: 'get',
      path: '/runs/:id',
      reads: 'replica',
      response: RunDetailSchema,
      tag: 'runs',
      summary: 'A run: summary, splits per mile and per km, device laps, fastest sections',
      access: 'own-data',
      params: { id: parseIdParam },
    },
    async (req, res) => {
      const actor = requireActor(res);
      const { inputsCounter } = res.locals;
      if (inputsCounter) sendReadyJson(res, await readyRunPage(actor, inputsCounter, req.params.id));
      else res.json(await describeRun(actor, req.params.id));
    },
  );

  api.route(
    {
      method: 'get',
      path: '/runs/:id/splits.csv',
      file: [CSV],
      tag: 'runs',
      summary: 'Splits as CSV (unit=mi|km): split,unit,distance,elapsed_s,moving_s,pace,avg_hr,max_hr,elev_gain_m,elev_loss_m,…',
      access: 'own-data',
      params: { id: parseIdParam },
      query: SplitsCsvQuerySchema,
    },
    async (req, res) => {
      const { unit } = res.locals.query;
      const { csv, filename } = await splitsCsvOf(requireActor(res), req.params.id, unit);
      res.type('text/csv; charset=utf-8').attachment(filename).send(csv);
    },
  );

  api.route(
    {
      method: 'get',
      path: '/runs/:id/track',
      response: RunTrackSchema,
      tag: 'runs',
      summary: 'The run’s series (time, distance, position, elevation, heart rate), thinned for charts',
      access: 'own-data',
      params: { id: parseIdParam },
    },
    async (req, res) => {
      res.json(await trackOf(requireActor(res), req.params.id));
    },
  );

  api.route(
    {
      method: 'get',
      path: '/runs/:id/original',
      file: ORIGINAL_CONTENT_TYPES,
      tag: 'runs',
      summary: 'The original uploaded file, byte for byte',
      access: 'own-data',
      params: { id: parseIdParam },
    },
    async (req, res) => {
      const file = await originalFileOf(requireActor(res), req.params.id, store);
      // attachment() would set the type from the name's extension; the type comes from the bytes instead.
      res.attachment(file.name).set('Content-Type', file.contentType).set('X-Content-Type-Options', 'nosniff').send(file.data);
    },
  );

  api.route(
    {
      method: 'patch',
      path: '/runs/:id',
      tag: 'runs',
      summary: 'Rename a run, or change its kind (run, ride or hike)',
      access: 'own-data',
      params: { id: parseIdParam },
      body: RenameRunInputSchema,
      response: RunListItemAnswerSchema,
    },
    async (req, res) => {
      res.json({
        run: await renameOwnRun(requireActor(res), req.params.id, { name: req.body.name, kind: req.body.kind }),
      });
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/runs/:id',
      tag: 'runs',
      summary: 'Delete a run (and its original file when no other run came from it)',
      access: 'own-data',
      params: { id: parseIdParam },
      status: 204,
    },
    async (req, res) => {
      await deleteOwnRun(requireActor(res), req.params.id, store);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'get',
      path: '/runs/:id/notes',
      tag: 'runs',
      summary: 'Notes on a run, oldest first (the runner and their coaches)',
      access: 'own-data',
      params: { id: parseIdParam },
      response: RunNoteListAnswerSchema,
    },
    async (req, res) => {
      res.json({ notes: await notesOf(requireActor(res), req.params.id) });
    },
  );

  api.route(
    {
      method: 'post',
      path: '/runs/:id/notes',
      tag: 'runs',
      summary: 'Write a note on a run',
      access: 'own-data',
      params: { id: parseIdParam },
      body: NewRunNoteInputSchema,
      response: RunNoteAnswerSchema,
      status: 201,
    },
    async (req, res) => {
      res.status(201).json({
        note: await addNote(requireActor(res), req.params.id, req.body.text, req.body.concern ?? null, {
          mailer,
          config,
        }),
      });
    },
  );

  return api;
}
