import type { Knex } from 'knex';
import * as demoPeople from './01_demo_people.ts';

/** Development seeds in order. Each one resets what it owns, so re-running is safe. */
export const SEEDS: Array<{ name: string; seed(knex: Knex): Promise<void> }> = [{ name: '01_demo_people', ...demoPeople }];

export async function runSeeds(knex: Knex): Promise<void> {
  for (const s of SEEDS) await s.seed(knex);
}
