import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // Read-your-writes with a read replica (server/lib/read-replica.ts): the primary's WAL insert position
  // after the user's last write. Read with the user on every request (the session query reads users.*),
  // so any web process can tell whether the replica has replayed that user's writes.
  await knex.raw('alter table users add column last_write_lsn pg_lsn');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('alter table users drop column last_write_lsn');
}
