import type { Request, RequestHandler } from 'express';
import type { z } from 'zod';
import { ValidationError } from './errors.ts';
import type { FieldIssue } from '../../shared/api/errors.ts';
import { toFieldIssues } from '../../shared/api/field-issues.ts';
import { controlCharacterIssues } from '../../shared/api/text.ts';

interface Schemas {
  query?: z.ZodType;
  body?: z.ZodType;
  /** Readers of path parameters; each throws its own error (a malformed id is simply not found). */
  params?: Record<string, (value: string | string[] | undefined) => unknown>;
}

/**
 * Validates the request against shared zod schemas and replaces body with the parsed value. Any string
 * holding a control character is refused first (`controlCharacterIssues`), field by field.
 * (query is read-only in Express 5, so parsed query lands in res.locals.query). Path parameters are
 * read last, after the query and body passed, so a bad body stays a 400 whatever the path says.
 */
export function validate(schemas: Schemas): RequestHandler {
  return (req, res, next) => {
    const problems: FieldIssue[] = [];
    for (const part of ['query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const input: unknown = part === 'body' ? (req.body ?? {}) : req[part];
      // No text field takes a control character (NUL and the like), whatever its schema says (issue 13 #13).
      const controls = controlCharacterIssues(input);
      if (controls.length > 0) {
        problems.push(...controls);
        continue;
      }
      const result = schema.safeParse(input);
      if (!result.success) {
        problems.push(...toFieldIssues(result.error));
        continue;
      }
      if (part === 'query') res.locals.query = result.data;
      else req.body = result.data;
    }
    if (problems.length > 0) {
      const first = problems[0]!;
      throw new ValidationError(problems.length === 1 ? first.message : 'Some fields need attention.', problems);
    }
    if (schemas.params) {
      const read: Record<string, unknown> = {};
      for (const [name, reader] of Object.entries(schemas.params)) read[name] = reader(req.params[name]);
      req.params = read as typeof req.params;
    }
    next();
  };
}

/**
 * The text a multipart upload carries besides its files: its text fields (`req.body`, which no zod schema reads on
 * the upload routes) and each file's name, which is stored. Refused with the same sentence as any other text field
 * holding a control character (issue 13 #13); null when all is clean.
 */
export function multipartTextProblem(req: Request, fileField: string): ValidationError | null {
  const files = [...((req.files as Express.Multer.File[] | undefined) ?? []), ...(req.file ? [req.file] : [])];
  const problems: FieldIssue[] = [
    ...controlCharacterIssues(req.body ?? {}),
    // multer decodes names as latin1; browsers send UTF-8 (a NUL or C1 byte is caught either way).
    ...files.flatMap((file, i) =>
      controlCharacterIssues(Buffer.from(file.originalname, 'latin1').toString('utf8'), [
        files.length > 1 ? `${fileField}.${i}.name` : `${fileField}.name`,
      ]),
    ),
  ];
  if (problems.length === 0) return null;
  return new ValidationError(problems.length === 1 ? problems[0]!.message : 'Some fields need attention.', problems);
}
