/** `npm run make-admin -- <email>`: gives an existing account the admin role (the first admin on a real install). */
import { startEmbeddedPostgres, usesExternalDatabase, withDatabase } from './lib/postgres.ts';

const email = process.argv[2];
if (!email) {
  console.error('Usage: npm run make-admin -- <email of an existing account>');
  process.exit(2);
}
if (!usesExternalDatabase()) process.env.DATABASE_URL = withDatabase(startEmbeddedPostgres(['pacewright']), 'pacewright');
const { db } = await import('../lib/db.ts');
try {
  const count = await db('users').whereRaw('lower(email) = lower(?)', [email]).update({ role: 'admin', updated_at: new Date() });
  if (count === 0) {
    console.error(`No account has the e-mail ${email}. Sign up first, then run this again.`);
    process.exitCode = 1;
  } else console.log(`${email} is now an admin.`);
} finally {
  await db.destroy();
}
