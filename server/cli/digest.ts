/**
 * `npm run digest [-- YYYY-MM-DD]`: e-mails every coach the weekly digest of each of their squads, for the
 * week containing the date (default: today). For a cron job, e.g. Monday 06:00: `npm run digest`.
 * Mail goes to SMTP_URL, or to the running app's local mail catcher in development.
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
const { sendSquadDigest } = await import('../features/weeks/digest.service.ts');

const config = loadConfig();
const mailer = createSmtpMailer(config);
let failures = 0;
try {
  const squads = await db('squads')
    .join('users', 'users.id', 'squads.coach_id')
    .select('squads.id', 'squads.name', 'users.id as coach_id', 'users.role', 'users.notify_on_digest');
  for (const squad of squads) {
    // The profile switch (or the digest's one-click unsubscribe) stops the weekly run; "send now" on the squad page still works.
    if (!squad.notify_on_digest) {
      console.log(`${squad.name}: the coach switched the digest off; not sent`);
      continue;
    }
    try {
      const sent = await sendSquadDigest({ id: squad.coach_id, role: squad.role }, squad.id, week, mailer, config);
      console.log(`${squad.name}: digest for the week of ${sent.week_start} sent to ${sent.sent_to}`);
    } catch (err) {
      failures++;
      const hint = !config.smtpUrl ? ' (is the app running with its mail catcher? Or set SMTP_URL)' : '';
      console.error(`${squad.name}: the digest could not be sent${hint}: ${(err as Error).message}`);
    }
  }
} finally {
  await db.destroy();
}
process.exit(failures ? 1 : 0);
