/** `npm run db:migrate | db:rollback | db:seed | db:make <name>` against DATABASE_URL or the embedded PostgreSQL. */
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { ROOT, startEmbeddedPostgres, usesExternalDatabase, withDatabase } from './lib/postgres.ts';

const [command, name] = process.argv.slice(2);

if (command === 'make') {
  if (!name || !/^[a-z0-9_]+$/.test(name)) {
    console.error('Usage: npm run db:make -- <snake_case_name>');
    process.exit(2);
  }
  const stamp = new Date().toISOString().replace(/\D/g, '').slice(0, 14);
  const file = path.join(ROOT, 'db/migrations', `${stamp}_${name}.ts`);
  writeFileSync(
    file,
    `import type { Knex } from 'knex';\n\nexport async function up(knex: Knex): Promise<void> {}\n\nexport async function down(knex: Knex): Promise<void> {}\n`,
  );
  console.log(`Created ${path.relative(ROOT, file)}. Add it to db/migrations/index.ts.`);
  process.exit(0);
}

if (!usesExternalDatabase()) process.env.DATABASE_URL = withDatabase(startEmbeddedPostgres(['pacewright']), 'pacewright');
const { db } = await import('../lib/db.ts');
try {
  if (command === 'migrate') {
    const [, applied] = (await db.migrate.latest()) as [number, string[]];
    console.log(applied.length ? `Applied: ${applied.join(', ')}` : 'Already up to date.');
  } else if (command === 'rollback') {
    const [, undone] = (await db.migrate.rollback()) as [number, string[]];
    console.log(undone.length ? `Rolled back: ${undone.join(', ')}` : 'Nothing to roll back.');
  } else if (command === 'seed') {
    const { loadDemoData } = await import('./lib/demo-data.ts');
    await db.migrate.latest();
    await loadDemoData(db);
    console.log('Demo data loaded.');
  } else {
    console.error('Usage: npm run db:migrate | db:rollback | db:seed | db:make -- <name>');
    process.exitCode = 2;
  }
} finally {
  await db.destroy();
}
