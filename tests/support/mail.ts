import { startMailCatcher, type MailCatcher } from '../../server/features/mail/mail-catcher.ts';
import { createSmtpMailer, type Mailer } from '../../server/lib/mailer.ts';
import { testConfig } from './test-app.ts';

/** A real SMTP round trip for tests: nodemailer → the mail catcher on a free loopback port → dev_outbox. */
export async function startTestMail(): Promise<{ catcher: MailCatcher; mailer: Mailer }> {
  const catcher = await startMailCatcher(0);
  return { catcher, mailer: createSmtpMailer({ ...testConfig(), mailCatcherPort: catcher.port }) };
}
