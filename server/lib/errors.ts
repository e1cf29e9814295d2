import type { FieldIssue } from '../../shared/api/errors.ts';

/** An error whose message is safe to show a user. `code` is stable for programs. */
export class AppError extends Error {
  /** Seconds the client should wait before trying again (a Retry-After header), for errors that pass. */
  retryAfterSeconds?: number;

  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

export class ValidationError extends AppError {
  constructor(message: string, issues: FieldIssue[]) {
    super(400, 'validation-failed', message, issues);
  }
}

export class BadRequestError extends AppError {
  constructor(message: string, code = 'bad-request') {
    super(400, code, message);
  }
}

export class UnauthorizedError extends AppError {
  constructor(message = 'Please sign in first.', code = 'not-signed-in') {
    super(401, code, message);
  }
}

export class ForbiddenError extends AppError {
  constructor(message = 'Your account is not allowed to do this.', code = 'forbidden') {
    super(403, code, message);
  }
}

export class NotFoundError extends AppError {
  constructor(message = 'Not found.') {
    super(404, 'not-found', message);
  }
}

export class ConflictError extends AppError {
  constructor(message: string, code = 'conflict') {
    super(409, code, message);
  }
}
