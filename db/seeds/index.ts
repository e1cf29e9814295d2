import type { Knex } from 'knex';
import type { FileStore } from '../../server/lib/storage.ts';
import * as demoPeople from './01_demo_people.ts';
import * as demoRuns from './02_demo_runs.ts';

/** Development seeds in order. Each one resets what it owns (demo users cascade to their runs), so re-running is safe. */
export async function runSeeds(knex: Knex, store: FileStore): Promise<void> {
  await demoPeople.seed(knex);
  await demoRuns.seed(knex, store);
}
