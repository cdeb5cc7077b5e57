import { BadRequestException, NotFoundException, ServiceUnavailableException } from '@nestjs/common';
import { ConnectionException, DriverException, SyntaxErrorException, UniqueConstraintViolationException } from '@mikro-orm/core';
import { describe, expect, it } from 'vitest';
import { DatabaseUnavailable, isDatabaseUnavailableError } from './database-unavailable.filter';

function withCode(message: string, code: string, extra: Record<string, unknown> = {}): Error {
  return Object.assign(new Error(message), { code, ...extra });
}

class KnexTimeoutError extends Error {
  override name = 'KnexTimeoutError';
}

describe('isDatabaseUnavailableError', () => {
  const unavailable: [string, unknown][] = [
    ['connection refused, through the driver', new DriverException(withCode('connect ECONNREFUSED 127.0.0.1:54329', 'ECONNREFUSED'))],
    ['connection reset, through the driver', new DriverException(withCode('read ECONNRESET', 'ECONNRESET'))],
    ['57P01 admin_shutdown (fast shutdown of the server)', new DriverException(withCode('terminating connection due to administrator command', '57P01'))],
    ['57P03 cannot_connect_now (server starting up)', new DriverException(withCode('the database system is starting up', '57P03'))],
    ['08006 connection_failure', new DriverException(withCode('connection failure', '08006'))],
    ['53300 too_many_connections from node-postgres directly', withCode('sorry, too many clients already', '53300', { severity: 'FATAL' })],
    ["MikroORM's ConnectionException", new ConnectionException(new Error('connection lost'))],
    ['node-postgres: connection terminated unexpectedly', new Error('Connection terminated unexpectedly')],
    ['node-postgres: connection timeout', new Error('Connection terminated due to connection timeout')],
    ['a database refusing connections during a restore swap (55000)', new DriverException(withCode('database "fieldbound" is not currently accepting connections', '55000'))],
    ['knex pool timeout', new KnexTimeoutError('Knex: Timeout acquiring a connection. The pool is probably full. Are you missing a .transacting(trx) call?')],
    ['AggregateError of refused attempts, through the driver', new DriverException(Object.assign(new AggregateError([withCode('connect ECONNREFUSED ::1:54329', 'ECONNREFUSED')], ''), { code: 'ECONNREFUSED' }))],
    ['wrapped as the cause of another error', new Error('saving the map failed', { cause: new DriverException(withCode('connect ECONNREFUSED 127.0.0.1:54329', 'ECONNREFUSED')) })],
  ];
  it.each(unavailable)('recognises %s', (_what, error) => {
    expect(isDatabaseUnavailableError(error)).toBe(true);
    expect(error instanceof DatabaseUnavailable).toBe(true);
  });

  const other: [string, unknown][] = [
    ['a unique-constraint violation (23505)', new UniqueConstraintViolationException(withCode('duplicate key value violates unique constraint', '23505'))],
    ['another 55000 (object not in prerequisite state)', new DriverException(withCode('cannot drop the currently open database', '55000'))],
    ['a syntax error (42601)', new SyntaxErrorException(withCode('syntax error at or near', '42601'))],
    ['an unknown database (3D000): configuration, not an outage', new DriverException(withCode('database "nope" does not exist', '3D000'))],
    ['a refused connection of the mail server (not through the database driver)', withCode('connect ECONNREFUSED 127.0.0.1:2525', 'ECONNREFUSED')],
    ['an HTTP 404', new NotFoundException()],
    ['a validation 400', new BadRequestException({ statusCode: 400, message: 'Some fields need attention.' })],
    ['a 503 thrown on purpose', new ServiceUnavailableException()],
    ['a TypeError', new TypeError("Cannot read properties of undefined (reading 'id')")],
    ['a string', 'Connection terminated'],
    ['null', null],
    ['a cycle of causes', (() => {
      const a = new Error('a') as Error & { cause?: unknown };
      const b = new Error('b', { cause: a });
      a.cause = b;
      return a;
    })()],
  ];
  it.each(other)('leaves alone %s', (_what, error) => {
    expect(isDatabaseUnavailableError(error)).toBe(false);
    expect(error instanceof DatabaseUnavailable).toBe(false);
  });
});
