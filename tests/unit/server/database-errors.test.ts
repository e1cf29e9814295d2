import { describe, expect, it } from 'vitest';
import { isDatabaseUnavailable } from '../../../server/lib/database-errors.ts';

/** An Error with the extra fields node-postgres and Node's sockets put on theirs. */
function errorWith(message: string, fields: Record<string, unknown> = {}): Error {
  return Object.assign(new Error(message), fields);
}

describe('isDatabaseUnavailable', () => {
  // Shapes recorded from Knex 3 + pg 8 against PostgreSQL 15 stopped, restarted and starved of connections.
  it.each([
    [
      'PostgreSQL stopped: a new connection is refused',
      errorWith('connect ECONNREFUSED 127.0.0.1:55431', { code: 'ECONNREFUSED' }),
    ],
    [
      'a query running when PostgreSQL shut down (fast mode)',
      errorWith('select pg_sleep(5) - terminating connection due to administrator command', { code: '57P01' }),
    ],
    [
      'a crash of another backend',
      errorWith('terminating connection because of crash of another server process', { code: '57P02' }),
    ],
    ['PostgreSQL still starting up', errorWith('the database system is starting up', { code: '57P03' })],
    ['every connection slot taken', errorWith('sorry, too many clients already', { code: '53300' })],
    ['a connection exception (class 08)', errorWith('connection failure', { code: '08006' })],
    ['a pooled connection that died while idle', errorWith('select 1 - Connection terminated unexpectedly')],
    ['pg-pool giving up on a connection', errorWith('Connection terminated due to connection timeout')],
    ['the connect timeout of pg', errorWith('timeout expired')],
    ['a client used after its connection failed', errorWith('Client has encountered a connection error and is not queryable')],
    ['a client used after it was closed', errorWith('Client was closed and is not queryable')],
    ['the link dropped mid-query', errorWith('read ECONNRESET', { code: 'ECONNRESET' })],
    ['the database host cannot be resolved', errorWith('getaddrinfo ENOTFOUND db.invalid', { code: 'ENOTFOUND' })],
    [
      'Knex waited too long for a pooled connection',
      Object.assign(
        errorWith('Knex: Timeout acquiring a connection. The pool is probably full. Are you missing a .transacting(trx) call?', {
          cause: new Error('operation timed out for an unknown reason'),
        }),
        { name: 'KnexTimeoutError' },
      ),
    ],
    [
      'every address of the host refused (Node tries each)',
      new AggregateError([errorWith('connect ECONNREFUSED ::1:5432', { code: 'ECONNREFUSED' })], 'all addresses failed'),
    ],
    [
      'a wrapped connection error',
      new Error('could not save the import', {
        cause: errorWith('connect ECONNREFUSED 127.0.0.1:5432', { code: 'ECONNREFUSED' }),
      }),
    ],
  ])('recognises %s', (_label, err) => {
    expect(isDatabaseUnavailable(err)).toBe(true);
  });

  it.each([
    ['a unique violation', errorWith('duplicate key value violates unique constraint "users_email_unique"', { code: '23505' })],
    ['a syntax error in SQL', errorWith('syntax error at or near "selec"', { code: '42601' })],
    ['a foreign-key violation', errorWith('insert violates foreign key constraint', { code: '23503' })],
    ['a statement cancelled by a timeout', errorWith('canceling statement due to statement timeout', { code: '57014' })],
    ['a dropped database (not coming back by waiting)', errorWith('database "x" does not exist', { code: '3D000' })],
    ['a bug in our code', new TypeError("Cannot read properties of undefined (reading 'id')")],
    ['a message that merely mentions a timeout', errorWith('the plan timeout expired')],
    ['a string', 'Connection terminated unexpectedly'],
    ['null', null],
    ['undefined', undefined],
    ['a number code', errorWith('odd', { code: 57 })],
  ])('does not take %s for an unreachable database', (_label, err) => {
    expect(isDatabaseUnavailable(err)).toBe(false);
  });

  it('stops looking into causes after a few levels, so a cycle cannot hang it', () => {
    const looped: Error & { cause?: unknown } = new Error('outer');
    looped.cause = looped;
    expect(isDatabaseUnavailable(looped)).toBe(false);
    const deep = new Error('1', {
      cause: new Error('2', {
        cause: new Error('3', { cause: new Error('4', { cause: errorWith('x', { code: 'ECONNREFUSED' }) }) }),
      }),
    });
    expect(isDatabaseUnavailable(deep)).toBe(false);
  });
});
