import { Router, type NextFunction, type Request, type RequestHandler, type Response } from 'express';
import type { z } from 'zod';
import type { Permission } from '../../shared/auth/permissions.ts';
import { authorize, type AuthLocals } from './authorize.ts';
import { replicaReads } from './read-replica.ts';
import { validate } from './validate.ts';

type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';

/** A path parameter's reader: returns the value the handler gets, or throws the error the caller sees (e.g. 404). */
export type ParamReader<T = unknown> = (value: string | string[] | undefined) => T;

/** What a route answers on success; exactly one of these, so every operation in /api/openapi.json documents it. */
export type AnswerSpec =
  /** A JSON body, parsed against this schema in the API tests. */
  | { response: z.ZodType; status?: 200 | 201 | 202; file?: never }
  /** A file: its media types (CSV, zip, GPX/TCX, iCalendar…). */
  | { file: readonly [string, ...string[]]; status?: 200; response?: never }
  /** No body. */
  | { status: 204; response?: never; file?: never };

/** One route's description: it both wires the route and documents it in /api/openapi.json. */
export type RouteSpec = {
  method: Method;
  /** Express path relative to /api, e.g. `/auth/login` or `/admin/users/:id`. */
  path: string;
  summary: string;
  tag: string;
  /** Who may call it — the only place a route says so (see shared/auth/permissions.ts). */
  access: Permission | 'public';
  /** Readers of the path parameters; the handler gets their results in `req.params`. */
  params?: Record<string, ParamReader>;
  body?: z.ZodType;
  query?: z.ZodType;
  /** Middleware that runs before validation, e.g. a rate limiter. */
  before?: RequestHandler[];
  /**
   * `replica`: a read-only page whose `readDb()` reads a streaming read replica may serve (server/lib/read-replica.ts).
   * Writes in its handler (marking notes read, storing results) still go to the primary through `db`.
   */
  reads?: 'replica';
} & AnswerSpec;

type ParamsOf<S> = S extends { params: infer P extends Record<string, ParamReader> }
  ? { [K in keyof P]: ReturnType<P[K]> }
  : Request['params'];
type BodyOf<S> = S extends { body: infer B extends z.ZodType } ? z.output<B> : unknown;
type QueryOf<S> = S extends { query: infer Q extends z.ZodType } ? z.output<Q> : undefined;
/** The body a handler may send: the answer schema's type, a file's bytes, or nothing. */
export type AnswerOf<S> = S extends { response: infer R extends z.ZodType }
  ? z.input<R>
  : S extends { file: readonly string[] }
    ? string | Buffer
    : undefined;

/** Locals a handler sees: the parsed query (Express 5's req.query is read-only) beside the sign-in locals. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- Express's own Locals type; the sign-in locals are read through AuthLocals
export type RouteLocals<S> = { query: QueryOf<S> } & AuthLocals & Record<string, any>;

/** A handler typed by its route: parsed params, body and query in, the declared answer out (`res.json`). */
export type RouteHandler<S extends RouteSpec> = (
  req: Request<ParamsOf<S>, AnswerOf<S>, BodyOf<S>>,
  res: Response<AnswerOf<S>, RouteLocals<S>>,
  next: NextFunction,
) => void | Promise<void>;

/** A sent answer that does not match its route's declaration (checked only while `answerCheck` is set). */
export interface AnswerMismatch {
  route: string;
  problem: string;
}

/**
 * Set by the API tests (tests/support/api-setup.ts): every 2xx answer is checked against its route's
 * declaration — JSON parsed with the answer schema as the client receives it, files by media type,
 * 204 without a body — and each mismatch is handed over. Unset in production: one `if` per request.
 */
type AnswerReport = (mismatch: AnswerMismatch | null) => void;
let answerCheck: AnswerReport | null = null;
/** Sets who hears of each checked answer (null: none); returns the one it replaces. */
export function checkAnswersWith(report: AnswerReport | null): AnswerReport | null {
  const before = answerCheck;
  answerCheck = report;
  return before;
}

function answerChecker(spec: RouteSpec): RequestHandler {
  const route = `${spec.method.toUpperCase()} /api${spec.path}`;
  return (_req, res, next) => {
    const report = answerCheck;
    if (!report) return next();
    const json = res.json.bind(res);
    let sentJson = false;
    res.json = (body: unknown) => {
      sentJson = true;
      if (res.statusCode >= 200 && res.statusCode < 300) {
        if (!spec.response) report({ route, problem: `answered JSON (${res.statusCode}) but declares no answer schema` });
        else {
          // What the client receives: dates as strings, undefined fields gone.
          const wire: unknown = body === undefined ? undefined : JSON.parse(JSON.stringify(body));
          const parsed = spec.response.safeParse(wire);
          report(
            parsed.success
              ? null
              : { route, problem: parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ') },
          );
        }
      }
      return json(body);
    };
    res.on('finish', () => {
      if (res.statusCode < 200 || res.statusCode >= 300 || sentJson) return;
      if (spec.response) {
        report({ route, problem: `answered ${res.statusCode} without the declared JSON body` });
        return;
      }
      if (res.statusCode === 204) {
        report(spec.status === 204 ? null : { route, problem: 'answered 204 but declares a body' });
        return;
      }
      const type = String(res.getHeader('Content-Type') ?? '')
        .split(';')[0]!
        .trim();
      report(
        spec.file?.includes(type)
          ? null
          : { route, problem: `answered ${res.statusCode} ${type || 'without a type'}, not a declared file type` },
      );
    });
    next();
  };
}

/**
 * Sends JSON serialized beforehand (ready answers, server/features/week-cache) with its entity tag, so neither is
 * made again per request. While the API tests check answers it goes through `res.json`, so its schema is checked.
 */
export function sendReadyJson(res: Response, answer: { body: Buffer; etag: string }): void {
  if (answerCheck) {
    res.json(JSON.parse(answer.body.toString('utf8')));
    return;
  }
  res.set('Content-Type', 'application/json; charset=utf-8').set('ETag', answer.etag).send(answer.body);
}

export interface ApiRouter {
  router: Router;
  specs: RouteSpec[];
  route<const S extends RouteSpec>(spec: S, handler: RouteHandler<S>): void;
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
        answerChecker(spec),
        ...(spec.before ?? []),
        authorize(spec.access),
        validate(spec),
        spec.reads === 'replica' ? replicaReads(handler as unknown as RequestHandler) : (handler as unknown as RequestHandler),
      );
    },
  };
}
