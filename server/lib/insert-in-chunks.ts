import type { Db } from './db.ts';

/**
 * PostgreSQL's wire protocol counts the parameters of one statement in a 16-bit field, so a statement
 * takes at most 65 535 bind parameters (PostgreSQL documentation, "Frontend/Backend Protocol" →
 * "Message Formats" → Bind: "Int16 The number of parameter values that follow"). One INSERT of all
 * the splits of a long enough track passed that and failed every time (issue 13 #13).
 */
export const MAX_BIND_PARAMETERS = 65_535;

/** Rows per INSERT at most, whatever the width: keeps each statement small (a marathon's splits fit in one). */
export const MAX_ROWS_PER_INSERT = 1_000;

/**
 * Inserts `rows` into `table` in as many statements as needed, each within MAX_ROWS_PER_INSERT rows
 * and MAX_BIND_PARAMETERS parameters (Knex binds one parameter per column of every row, the columns
 * being the union of the rows' keys). Call inside a transaction to keep all-or-nothing.
 */
export async function insertInChunks(trx: Db, table: string, rows: readonly object[]): Promise<void> {
  if (rows.length === 0) return;
  const columns = new Set(rows.flatMap((row) => Object.keys(row))).size;
  const perStatement = Math.max(1, Math.min(MAX_ROWS_PER_INSERT, Math.floor(MAX_BIND_PARAMETERS / columns)));
  for (let start = 0; start < rows.length; start += perStatement) {
    await trx.table(table).insert(rows.slice(start, start + perStatement));
  }
}
