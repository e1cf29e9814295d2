import { ZIP } from '../../../shared/api/media-types.ts';
import { mkdirSync } from 'node:fs';
import { rm } from 'node:fs/promises';
import { randomUUID } from 'node:crypto';
import multer from 'multer';
import type { RequestHandler } from 'express';
import {
  DeleteAccountInputSchema,
  ImportCreatedSchema,
  ImportProgressSchema,
  type DeleteAccountInput,
} from '../../../shared/history/schemas.ts';
import { formatFileSize } from '../../../shared/units.ts';
import type { AppConfig } from '../../config.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { requireActor } from '../../lib/authorize.ts';
import { AppError, BadRequestError } from '../../lib/errors.ts';
import { parseIdParam } from '../../lib/ids.ts';
import { multipartTextProblem } from '../../lib/validate.ts';
import type { FileStore } from '../../lib/storage.ts';
import { clearSessionCookie } from '../auth/index.ts';
import { uploadGuards } from '../runs/index.ts';
import { deleteAccount } from './account.service.ts';
import { streamExport } from './export.service.ts';
import { enqueueImport } from './import-queue.ts';
import { createImport, getImportProgress, importsDir } from './imports.service.ts';

/**
 * The archive goes straight to disk (never into memory) under DATA_DIR/imports, with a size cap.
 * The caller must be signed in before a byte is written.
 */
function uploadArchive(dataDir: string, maxBytes: number): RequestHandler {
  const dir = importsDir(dataDir);
  const upload = multer({
    storage: multer.diskStorage({
      destination: (_req, _file, cb) => {
        mkdirSync(dir, { recursive: true });
        cb(null, dir);
      },
      filename: (_req, _file, cb) => cb(null, `upload-${randomUUID()}.part`),
    }),
    limits: { fileSize: maxBytes, files: 1, fields: 5, parts: 6 },
  }).single('file');
  return (req, res, next) => {
    requireActor(res);
    upload(req, res, (err: unknown) => {
      if (!err) {
        const problem = multipartTextProblem(req, 'file');
        if (!problem) return next();
        // Refused whole, and nothing of it kept.
        return void (req.file ? rm(req.file.path, { force: true }) : Promise.resolve()).then(() => next(problem));
      }
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE')
          return next(
            new AppError(
              413,
              'too-large',
              `A history archive can be at most ${formatFileSize(maxBytes)}. Split it into smaller zips and upload them one after another.`,
            ),
          );
        if (err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT' || err.code === 'LIMIT_PART_COUNT')
          return next(new BadRequestError('Send one .zip file in a form field named "file".'));
        return next(new BadRequestError('The upload could not be read. Please try again.'));
      }
      next(new BadRequestError('The upload could not be read. Please send the archive as multipart/form-data.'));
    });
  };
}

export function createHistoryRouter(store: FileStore, config: AppConfig) {
  const api = createApiRouter();

  api.route(
    {
      method: 'post',
      path: '/imports',
      tag: 'history',
      summary:
        'Bulk import: a .zip of GPX/TCX files (also .gz) as the multipart part "file"; checked, stored, then imported in the background',
      access: 'own-data',
      response: ImportCreatedSchema,
      status: 202,
      // Signed in, not too many uploads, storage left: settled before a byte of the archive is read.
      before: [
        ...uploadGuards(config, { route: 'import-archives', checkStorage: true }),
        uploadArchive(config.dataDir, config.uploadMaxArchiveBytes),
      ],
    },
    async (req, res) => {
      const file = req.file;
      if (!file) throw new BadRequestError('Choose a .zip file with your GPX or TCX files.', 'no-file');
      const created = await createImport(
        requireActor(res),
        // multer decodes names as latin1; browsers send UTF-8.
        { file: file.path, name: Buffer.from(file.originalname, 'latin1').toString('utf8') },
        {
          dataDir: config.dataDir,
          maxEntryBytes: config.uploadMaxFileBytes,
          enqueue: (id, openFiles) => enqueueImport(id, config.databaseUrl, openFiles),
        },
      );
      res.status(202).json({ import: created });
    },
  );

  api.route(
    {
      method: 'get',
      path: '/imports/:id',
      tag: 'history',
      summary: 'Progress of a bulk import: status, files done of total, imported, duplicates, rejected with reasons',
      access: 'own-data',
      params: { id: parseIdParam },
      response: ImportProgressSchema,
    },
    async (req, res) => {
      res.json(await getImportProgress(requireActor(res), req.params.id));
    },
  );

  api.route(
    {
      method: 'get',
      path: '/me/export',
      file: [ZIP],
      tag: 'history',
      summary:
        'Everything of the signed-in user as a streamed .zip: original files, runs.csv, splits-mi.csv, splits-km.csv, plans, fuel, notes, profile, races',
      access: 'own-data',
    },
    async (_req, res) => {
      const actor = requireActor(res);
      res.type('application/zip').attachment(`pacewright-export-${new Date().toISOString().slice(0, 10)}.zip`);
      await streamExport(actor, store, res);
    },
  );

  api.route(
    {
      method: 'delete',
      path: '/me',
      tag: 'history',
      summary: 'Delete the account and everything in it (runs, files, plans, notes, squads coached); confirm with the password',
      access: 'own-data',
      body: DeleteAccountInputSchema,
      status: 204,
    },
    async (req, res) => {
      await deleteAccount(requireActor(res), (req.body as DeleteAccountInput).password, store, config, req.ip);
      clearSessionCookie(res, config);
      res.status(204).end();
    },
  );

  return api;
}
