/**
 * `npm run digest [-- YYYY-MM-DD]`: e-mails every coach the weekly digest of each of their squads now, for the
 * week containing the date (default: today). The manual trigger: workers also send it on DIGEST_SCHEDULE (default
 * Monday 06:00 UTC, the week just ended; server/features/jobs/README.md). Mail goes to SMTP_URL, or to the
 * running app's local mail catcher in development.
 */
import { startEmbeddedPostgres, usesExternalDatabase, withDatabase } from './lib/postgres.ts';

const week = process.argv[2];
if (week !== undefined && !/^\d{4}-\d\d-\d\d$/.test(week)) {
  console.error('Usage: npm run digest [-- YYYY-MM-DD]');
  process.exit(2);
}
if (!usesExternalDatabase()) process.env.DATABASE_URL = withDatabase(startEmbeddedPostgres(['pacewright']), 'pacewright');

const { loadConfig } = await import('../config.ts');
const { db } = await import('../lib/db.ts');
const { createSmtpMailer } = await import('../lib/mailer.ts');
const { sendDigestRound } = await import('../features/weeks/digest.service.ts');

const config = loadConfig();
const mailer = createSmtpMailer(config);
let failures = 0;
try {
  for (const line of await sendDigestRound(week, mailer, config)) {
    if (line.outcome === 'sent') console.log(`${line.squad}: digest for the week of ${line.week_start} sent to ${line.sent_to}`);
    else if (line.outcome === 'off') console.log(`${line.squad}: the coach switched the digest off; not sent`);
    else {
      failures++;
      const hint = !config.smtpUrl ? ' (is the app running with its mail catcher? Or set SMTP_URL)' : '';
      console.error(`${line.squad}: the digest could not be sent${hint}: ${line.error}`);
    }
  }
} finally {
  await db.destroy();
}
process.exit(failures ? 1 : 0);
