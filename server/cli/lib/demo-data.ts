import type { Knex } from 'knex';
import { runSeeds } from '../../../db/seeds/index.ts';
import { databaseUrlFromEnv, loadConfig } from '../../config.ts';
import { createStoreFromEnv } from '../../lib/storage.ts';

/** Loads the demo scenario (people, squad, generated runs) into the database the app uses. */
export async function loadDemoData(knex: Knex): Promise<void> {
  const config = loadConfig();
  await runSeeds(knex, await createStoreFromEnv(config.dataDir));
}

/** Loads the demo data only into an empty database (first run). Returns whether it did. */
export async function loadDemoDataOnFirstRun(knex: Knex): Promise<boolean> {
  const { count } = (await knex('users').count({ count: '*' }).first()) as { count: string };
  if (Number(count) > 0) return false;
  console.log(`Loading the demo data into ${new URL(databaseUrlFromEnv()).pathname.slice(1)} (about half a minute)…`);
  await loadDemoData(knex);
  return true;
}
