import bcrypt from 'bcryptjs';
import type { Knex } from 'knex';

/**
 * The invented demo scenario of product.md: the "Harbor Line Runners" club, its coach and three
 * runners preparing for an invented autumn marathon, plus the first admin. Every name is made up.
 */
export const DEMO_DOMAIN = 'harborline.test';
export const DEMO_PEOPLE = [
  { email: `coach@${DEMO_DOMAIN}`, name: 'Dana Whitlock', role: 'coach', password: 'harbor-coach-demo', unit: 'mi' },
  { email: `ivy@${DEMO_DOMAIN}`, name: 'Ivy Calder', role: 'runner', password: 'harbor-ivy-demo', unit: 'mi' },
  { email: `tomas@${DEMO_DOMAIN}`, name: 'Tomás Rinaldi', role: 'runner', password: 'harbor-tomas-demo', unit: 'km' },
  { email: `priya@${DEMO_DOMAIN}`, name: 'Priya Olsen', role: 'runner', password: 'harbor-priya-demo', unit: 'mi' },
  { email: `admin@${DEMO_DOMAIN}`, name: 'Site Admin', role: 'admin', password: 'harbor-admin-demo', unit: 'km' },
] as const;
export const DEMO_SQUAD_NAME = 'Harbor Line Runners';

const DEMO_TIME_ZONE = 'America/Chicago';
const DEMO_PROFILES: Record<string, { birth_year: number; resting_hr: number; max_hr: number; weight_kg: number }> = {
  [`ivy@${DEMO_DOMAIN}`]: { birth_year: 1991, resting_hr: 48, max_hr: 188, weight_kg: 58 },
  [`tomas@${DEMO_DOMAIN}`]: { birth_year: 1986, resting_hr: 52, max_hr: 181, weight_kg: 71 },
  [`priya@${DEMO_DOMAIN}`]: { birth_year: 1995, resting_hr: 55, max_hr: 193, weight_kg: 62 },
};

export async function seed(knex: Knex): Promise<void> {
  // Re-runnable: remove what this seed owns (cascades to squads, tokens and later demo data).
  await knex('users').whereILike('email', `%@${DEMO_DOMAIN}`).delete();
  const rows = await Promise.all(
    DEMO_PEOPLE.map(async (p) => ({
      email: p.email,
      name: p.name,
      role: p.role,
      unit: p.unit,
      time_zone: DEMO_TIME_ZONE,
      password_hash: await bcrypt.hash(p.password, 10),
      ...DEMO_PROFILES[p.email],
    })),
  );
  const users = await knex('users').insert(rows).returning(['id', 'email', 'role']);
  const coach = users.find((u) => u.role === 'coach')!;
  const [squad] = await knex('squads').insert({ coach_id: coach.id, name: DEMO_SQUAD_NAME }).returning('id');
  await knex('squad_members').insert(
    users.filter((u) => u.role === 'runner').map((u) => ({ squad_id: squad!.id, runner_id: u.id })),
  );
}
