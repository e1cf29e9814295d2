import type { AppConfig } from '../../config.ts';

/** Node's listen error: `EADDRINUSE` with the port it could not take. */
type ListenError = { code?: unknown; port?: unknown };

/**
 * One plain sentence for a port already taken at start-up, naming the variable that moves it, or
 * null when the error is something else (issue 17: no raw stack trace for a busy port).
 */
export function portInUseMessage(
  err: unknown,
  config: Pick<AppConfig, 'port' | 'mailCatcherPort'> & { payments: { fakePort: number } },
): string | null {
  if (typeof err !== 'object' || err === null || (err as ListenError).code !== 'EADDRINUSE') return null;
  const port = Number((err as ListenError).port);
  const variable =
    port === config.port
      ? 'PORT'
      : port === config.mailCatcherPort
        ? 'MAIL_CATCHER_PORT'
        : port === config.payments.fakePort && port !== 0
          ? 'PAYMENTS_FAKE_PORT'
          : null;
  const which =
    Number.isFinite(port) && port > 0 ? `Port ${port} is already in use` : 'A port Pacewright needs is already in use';
  return variable
    ? `${which}: stop the program using it, or set ${variable} to a free port (e.g. ${variable}=${port + 1} npm start).`
    : `${which}: stop the program using it, or set PORT or MAIL_CATCHER_PORT to a free port.`;
}
