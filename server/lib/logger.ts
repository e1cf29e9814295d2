import { pino, type DestinationStream, type Level } from 'pino';

/** Standard output, unless a test reads the lines itself (`captureLogLines`). */
let destination: DestinationStream = pino.destination(1);

export const logger = pino(
  {
    level: process.env.LOG_LEVEL ?? (process.env.NODE_ENV === 'test' ? 'silent' : 'info'),
    // The CSRF token is a per-browser secret like the cookie it doubles (issue 13 #15).
    redact: ['req.headers.cookie', 'req.headers.authorization', 'req.headers["x-csrf-token"]', 'res.headers["set-cookie"]'],
  },
  { write: (line: string) => destination.write(line) },
);

/** Invitation, password-reset, sign-up and unsubscribe links carry their secret in the path: logs keep only its kind. */
export function loggableUrl(url: string): string {
  return url.replace(/\b(inv|rst|cal|sgn|uns)_[A-Za-z0-9_-]+/g, '$1_[Redacted]');
}

/**
 * Tests only: every log line from `level` up goes to `onLine` (and not to standard output) until
 * the returned function is called, so a test can prove that no secret is ever logged.
 */
export function captureLogLines(onLine: (line: string) => void, level: Level = 'trace'): () => void {
  const previous = { destination, level: logger.level };
  destination = { write: onLine };
  logger.level = level;
  return () => {
    destination = previous.destination;
    logger.level = previous.level;
  };
}
