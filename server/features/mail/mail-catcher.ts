import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { AddressInfo } from 'node:net';
import { logger } from '../../lib/logger.ts';
import { insertCaughtMessage } from './outbox.repository.ts';

/**
 * The message's headers as sent: lower-case names, folded lines joined (RFC 5322 §2.2.3), repeated
 * headers (Received) joined with ", ". Taken from the raw lines, not mailparser's parsed values,
 * which turn List-* headers into objects.
 */
export function headersOf(lines: ReadonlyArray<{ key: string; line: string }>): Record<string, string> {
  const headers: Record<string, string> = {};
  for (const { key, line } of lines) {
    const value = line
      .slice(line.indexOf(':') + 1)
      .replace(/\r?\n[ \t]+/g, ' ')
      .trim();
    const name = key.toLowerCase();
    headers[name] = name in headers ? `${headers[name]}, ${value}` : value;
  }
  return headers;
}

export interface MailCatcher {
  port: number;
  close(): Promise<void>;
}

/**
 * A development SMTP server on 127.0.0.1 that accepts every message and keeps it in the dev_outbox
 * table, where the outbox page reads it. Never started in production or when SMTP_URL is set.
 */
export async function startMailCatcher(port: number): Promise<MailCatcher> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    banner: 'Pacewright development mail catcher',
    size: 5 * 1024 * 1024,
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const to = [parsed.to]
            .flat()
            .flatMap((a) => (a ? a.value.map((v) => v.address ?? '') : []))
            .join(', ');
          await insertCaughtMessage({
            to,
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : '',
            headers: headersOf(parsed.headerLines),
          });
          callback();
        })
        .catch((err: Error) => {
          logger.error({ err }, 'mail catcher could not store a message');
          callback(err);
        });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  const address = server.server.address() as AddressInfo;
  return {
    port: address.port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
