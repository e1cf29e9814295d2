import express from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { checkAnswersWith, createApiRouter, type AnswerMismatch } from '../../server/lib/api-router.ts';
import { answersChecked } from '../support/answers-checked.ts';
import { testApp } from '../support/test-app.ts';

// Issue 18: one contract per endpoint. Every operation of /api/openapi.json documents its success answer,
// and every 2xx answer of the API suite is parsed against its route's schema (tests/support/api-setup.ts).

interface Operation {
  responses: Record<string, { description: string; content?: Record<string, { schema?: unknown }> }>;
}

/** The media types the API answers files in (shared/api/media-types.ts, shared/runs/original-download.ts). */
const FILE_TYPES = [
  'text/csv',
  'application/zip',
  'text/calendar',
  'application/gpx+xml',
  'application/gzip',
  'application/octet-stream',
];

describe('every operation documents its answer', () => {
  it('each success response in /api/openapi.json is a JSON schema, a file media type or 204 no content', async () => {
    const doc = (await request(testApp()).get('/api/openapi.json')).body as { paths: Record<string, Record<string, Operation>> };
    const operations = Object.entries(doc.paths).flatMap(([path, ops]) =>
      Object.entries(ops).map(([method, op]) => ({ key: `${method.toUpperCase()} ${path}`, op })),
    );
    expect(operations.length).toBeGreaterThan(100);

    const undocumented: string[] = [];
    const kinds = { json: 0, file: 0, none: 0 };
    for (const { key, op } of operations) {
      const success = Object.entries(op.responses).filter(([code]) => code.startsWith('2'));
      if (success.length !== 1) {
        undocumented.push(`${key}: ${success.length} success responses`);
        continue;
      }
      const [code, response] = success[0]!;
      const types = Object.keys(response.content ?? {});
      if (code === '204') {
        if (types.length > 0) undocumented.push(`${key}: 204 with a body`);
        else kinds.none++;
      } else if (types.length === 1 && types[0] === 'application/json' && response.content!['application/json']!.schema) {
        kinds.json++;
      } else if (types.length > 0 && types.every((t) => FILE_TYPES.includes(t))) {
        kinds.file++;
      } else {
        undocumented.push(`${key}: ${code} without an answer schema or media type`);
      }
    }
    expect(undocumented).toEqual([]);
    // Each kind is in use, so each branch above is exercised.
    expect(kinds.json).toBeGreaterThan(50);
    expect(kinds.file).toBeGreaterThanOrEqual(8);
    expect(kinds.none).toBeGreaterThan(10);
  });
});

describe('answers are parsed against their schema in the API tests', () => {
  /** A small app with deliberately wrong routes, heard by a recorder of its own instead of the suite's. */
  async function mismatchesOf(send: (app: express.Express) => Promise<unknown>): Promise<Array<AnswerMismatch | null>> {
    const api = createApiRouter();
    api.route(
      { method: 'get', path: '/right', tag: 't', summary: 's', access: 'public', response: z.object({ n: z.number() }) },
      (_req, res) => {
        res.json({ n: 1 });
      },
    );
    api.route(
      { method: 'get', path: '/wrong', tag: 't', summary: 's', access: 'public', response: z.object({ n: z.number() }) },
      (_req, res) => {
        // The server's type says otherwise; a stored value of the wrong shape gets here at run time.
        res.json(JSON.parse('{"n":"one"}') as { n: number });
      },
    );
    api.route({ method: 'get', path: '/file', tag: 't', summary: 's', access: 'public', file: ['text/csv'] }, (_req, res) => {
      res.type('text/html').send('<p>not a CSV</p>');
    });
    api.route({ method: 'delete', path: '/gone', tag: 't', summary: 's', access: 'public', status: 204 }, (_req, res) => {
      res.status(204).end();
    });
    const app = express();
    app.use(api.router);
    const heard: Array<AnswerMismatch | null> = [];
    const suite = checkAnswersWith((m) => heard.push(m));
    try {
      await send(app);
    } finally {
      checkAnswersWith(suite);
    }
    return heard;
  }

  it('an answer that matches its schema passes; one that does not is reported with the field', async () => {
    expect(await mismatchesOf((app) => request(app).get('/right'))).toEqual([null]);
    const [wrong] = await mismatchesOf((app) => request(app).get('/wrong'));
    expect(wrong).toEqual({ route: 'GET /api/wrong', problem: expect.stringMatching(/^n: /) });
  });

  it('a file of an undeclared type is reported; a 204 without a body passes', async () => {
    const [file] = await mismatchesOf((app) => request(app).get('/file'));
    expect(file).toEqual({ route: 'GET /api/file', problem: expect.stringContaining('text/html') });
    expect(await mismatchesOf((app) => request(app).delete('/gone'))).toEqual([null]);
  });

  it('the suite’s own check is on: a real answer is counted', async () => {
    const before = answersChecked.count;
    const res = await request(testApp()).get('/api/health');
    expect(res.status).toBe(200);
    expect(answersChecked.count).toBe(before + 1);
  });
});
