import knexFactory, { type Knex } from 'knex';
import pg from 'pg';
import { knexConfig } from '../../db/knexfile.ts';
import { databaseUrlFromEnv } from '../config.ts';

// Return numeric columns (weight_kg) as JS numbers; our values are small and never need arbitrary precision.
pg.types.setTypeParser(pg.types.builtins.NUMERIC, (v) => Number(v));

export interface UserRow {
  id: string;
  email: string;
  password_hash: string;
  name: string;
  role: 'runner' | 'coach' | 'admin';
  unit: 'mi' | 'km';
  birth_year: number | null;
  resting_hr: number | null;
  max_hr: number | null;
  weight_kg: number | null;
  time_zone: string;
  created_at: Date;
  updated_at: Date;
}

export interface ApiTokenRow {
  id: string;
  user_id: string;
  name: string;
  token_hash: string;
  created_at: Date;
  expires_at: Date;
  last_used_at: Date | null;
}

export interface SquadRow {
  id: string;
  coach_id: string;
  name: string;
  created_at: Date;
}

export interface SquadMemberRow {
  squad_id: string;
  runner_id: string;
  joined_at: Date;
}

declare module 'knex/types/tables.js' {
  interface Tables {
    users: UserRow;
    api_tokens: ApiTokenRow;
    squads: SquadRow;
    squad_members: SquadMemberRow;
  }
}

/** The single Knex instance. Only repositories (and scripts) import it. */
export const db: Knex = knexFactory(knexConfig(databaseUrlFromEnv()));

export type Db = Knex | Knex.Transaction;

/** PostgreSQL's SQLSTATE for a unique violation. */
export const PG_UNIQUE_VIOLATION = '23505';

export function isUniqueViolation(err: unknown): boolean {
  return typeof err === 'object' && err !== null && (err as { code?: string }).code === PG_UNIQUE_VIOLATION;
}

export async function isDatabaseUp(): Promise<boolean> {
  try {
    await db.raw('select 1');
    return true;
  } catch {
    return false;
  }
}
