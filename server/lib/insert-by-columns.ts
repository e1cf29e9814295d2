import type { Knex } from 'knex';
import type { Db } from './db.ts';

/**
 * PostgreSQL's wire protocol counts the parameters of one statement in a 16-bit field, so a statement
 * takes at most 65 535 bind parameters (PostgreSQL documentation, "Frontend/Backend Protocol" →
 * "Message Formats" → Bind: "Int16 The number of parameter values that follow"). One INSERT of all
 * the splits of a long enough track with one parameter per value passed that and failed every time
 * (issue 13 #13); with one array per column a statement has as many parameters as columns.
 */
export const MAX_BIND_PARAMETERS = 65_535;

/** A table's rows to insert, all with the same keys (one per column they fill). */
export interface RowsOf {
  table: string;
  rows: readonly object[];
}

/** Column name → its SQL type as `format_type` writes it, per table; read once per process. */
const columnTypes = new Map<string, Promise<Map<string, string>>>();

function typesOf(trx: Db, table: string): Promise<Map<string, string>> {
  let types = columnTypes.get(table);
  if (!types) {
    types = trx
      .raw<{ rows: Array<{ name: string; type: string }> }>(
        `select attname as name, format_type(atttypid, atttypmod) as type
           from pg_attribute where attrelid = ?::regclass and attnum > 0 and not attisdropped`,
        [table],
      )
      .then(({ rows }) => new Map(rows.map((r) => [r.name, r.type])));
    // A failed lookup (say, inside a transaction that was already aborted) is tried again next time.
    types.catch(() => columnTypes.delete(table));
    columnTypes.set(table, types);
  }
  return types;
}

/**
 * Inserts the rows of several tables in ONE statement and one round trip: each table's rows go as
 * one array per column (`unnest($1::uuid[], $2::float8[], …)`), so a statement has one parameter per
 * column whatever the number of rows (so MAX_BIND_PARAMETERS never binds), and PostgreSQL parses a
 * short statement instead of thousands of placeholders.
 * node-postgres writes each array in PostgreSQL's array syntax, values as their text: NaN, ±Infinity,
 * null and dates come through as with one parameter per value. The tables are written in the order
 * given (data-modifying WITH clauses; no row of one reads another's). Call inside a transaction.
 */
export async function insertRowsByColumns(trx: Db, tables: readonly RowsOf[]): Promise<void> {
  const filled = tables.filter((t) => t.rows.length > 0);
  if (filled.length === 0) return;
  const parts: string[] = [];
  const bindings: Knex.RawBinding[] = [];
  for (const [n, { table, rows }] of filled.entries()) {
    const names = Object.keys(rows[0]!);
    for (const row of rows) {
      const keys = Object.keys(row);
      if (keys.length !== names.length || keys.some((k, i) => k !== names[i]))
        throw new Error(`insertRowsByColumns: every row of ${table} must have the keys ${names.join(', ')} in that order`);
    }
    const types = await typesOf(trx, table);
    const arrays = names.map((name) => {
      const type = types.get(name);
      if (!type) throw new Error(`insertRowsByColumns: ${table} has no column ${name}`);
      // One array per column (node-postgres writes it in PostgreSQL's array syntax).
      bindings.push(rows.map((row) => (row as Record<string, Knex.Value>)[name] ?? null) as unknown as Knex.RawBinding);
      // `?` is a value; `??` an identifier (Knex). The cast names the array's element type.
      return `?::${type}[]`;
    });
    const insert = `insert into ?? (${names.map(() => '??').join(', ')}) select * from unnest(${arrays.join(', ')})`;
    bindings.splice(bindings.length - names.length, 0, table, ...names);
    parts.push(n < filled.length - 1 ? `t${n} as (${insert})` : insert);
  }
  const last = parts.pop()!;
  await trx.raw(parts.length > 0 ? `with ${parts.join(', ')} ${last}` : last, bindings);
}
