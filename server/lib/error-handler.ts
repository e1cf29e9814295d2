import type { ErrorRequestHandler, Request, RequestHandler } from 'express';
import { DATABASE_RETRY_AFTER_SECONDS, DatabaseUnavailableError, isDatabaseUnavailable } from './database-errors.ts';
import { AppError } from './errors.ts';
import { loggableUrl, logger } from './logger.ts';

interface HttpParserError {
  type?: string;
  status?: number;
}

/** Errors raised by Express's body parser (or its router, for a path it cannot decode) before any route runs. */
function fromBodyParser(err: HttpParserError): AppError | null {
  // A broken %-escape in the path ("/api/runs/%E0%A4%A"): the router refuses to decode it.
  if (err instanceof URIError)
    return new AppError(400, 'malformed-address', 'This address is not valid: part of it cannot be read.');
  switch (err.type) {
    case 'entity.parse.failed':
      return new AppError(400, 'malformed-json', 'The request body is not valid JSON.');
    case 'entity.too.large':
      return new AppError(413, 'too-large', 'The request is too large.');
    case 'encoding.unsupported':
    case 'charset.unsupported':
      return new AppError(415, 'unsupported-encoding', 'The request uses an encoding the server does not accept.');
    default:
      return null;
  }
}

/**
 * Calls `send` once the client has sent its whole request, as Express's own final handler does. An
 * upload refused before anything read it (401, or 503 while the database is away) would otherwise have
 * its connection cut mid-upload, and the client would see "connection reset" instead of the answer.
 */
function afterRequestArrived(req: Request, send: () => void): void {
  if (req.complete || req.destroyed) return send();
  let sent = false;
  const once = () => {
    if (sent) return;
    sent = true;
    send();
  };
  req.once('end', once);
  req.once('close', once);
  req.unpipe();
  req.resume();
}

/** Last middleware: every error becomes `{error, code, details?}` with the right status (api-contract.md). */
export const errorHandler: ErrorRequestHandler = (err, req, res, next) => {
  // The answer has begun (a streamed download): only Express can still end it properly.
  if (res.headersSent) return next(err);
  let known = err instanceof AppError ? err : fromBodyParser(err as HttpParserError);
  if (!known && isDatabaseUnavailable(err)) {
    // Not a bug to chase: PostgreSQL is stopped or restarting. A warning, and the client is told to come back.
    logger.warn({ err, method: req.method, url: loggableUrl(req.originalUrl) }, 'the database cannot be reached');
    known = new DatabaseUnavailableError();
  }
  if (!known) logger.error({ err, method: req.method, url: loggableUrl(req.originalUrl) }, 'unhandled error');
  afterRequestArrived(req, () => {
    if (!known) {
      res.status(500).json({ error: 'Something went wrong on our side. Please try again.', code: 'internal' });
      return;
    }
    if (known instanceof DatabaseUnavailableError) res.set('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS));
    else if (known.retryAfterSeconds !== undefined) res.set('Retry-After', String(known.retryAfterSeconds));
    res.status(known.status).json({
      error: known.message,
      code: known.code,
      ...(known.details === undefined ? {} : { details: known.details }),
    });
  });
};

export const notFoundHandler: RequestHandler = (_req, res) => {
  res.status(404).json({ error: 'There is nothing at this address.', code: 'not-found' });
};
