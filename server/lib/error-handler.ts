import type { ErrorRequestHandler, RequestHandler } from 'express';
import { AppError } from './errors.ts';
import { logger } from './logger.ts';

interface HttpParserError {
  type?: string;
  status?: number;
}

/** Errors raised by Express's body parser before any route runs. */
function fromBodyParser(err: HttpParserError): AppError | null {
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

/** Last middleware: every error becomes `{error, code, details?}` with the right status (api-contract.md). */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const known = err instanceof AppError ? err : fromBodyParser(err as HttpParserError);
  if (known) {
    res.status(known.status).json({
      error: known.message,
      code: known.code,
      ...(known.details === undefined ? {} : { details: known.details }),
    });
    return;
  }
  logger.error({ err, method: req.method, url: req.originalUrl }, 'unhandled error');
  res.status(500).json({ error: 'Something went wrong on our side. Please try again.', code: 'internal' });
};

export const notFoundHandler: RequestHandler = (_req, res) => {
  res.status(404).json({ error: 'There is nothing at this address.', code: 'not-found' });
};
