import { type ArgumentsHost, Catch, type ExceptionFilter, HttpException, HttpStatus, Logger } from '@nestjs/common';
import { ConnectionException, DriverException } from '@mikro-orm/core';
import type { Response } from 'express';

/** The body of every 503 caused by the database being out of reach. */
export interface DatabaseUnavailableBody {
  statusCode: 503;
  code: 'database_unavailable';
  message: string;
}

export const DATABASE_UNAVAILABLE_MESSAGE = 'The database is unavailable; try again shortly.';
/** Seconds a client should wait before retrying (a restart of the local cluster takes well under a second). */
export const DATABASE_RETRY_AFTER_SECONDS = 5;

/**
 * SQLSTATEs that mean "no usable connection", not "this query is wrong": class 08 (connection
 * exception), 57P01 admin_shutdown, 57P02 crash_shutdown, 57P03 cannot_connect_now (starting up),
 * 53300 too_many_connections (PostgreSQL 15 manual, Appendix A).
 */
const UNAVAILABLE_SQLSTATES = new Set(['57P01', '57P02', '57P03', '53300']);
/** Socket errors of a connection attempt or an established connection. */
const SOCKET_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENETUNREACH', 'EAI_AGAIN', 'ENOTCONN']);
/** Messages of node-postgres and knex that carry no code. */
const UNAVAILABLE_MESSAGES = [
  /^Connection terminated/i, // node-postgres: "… unexpectedly", "… due to connection timeout"
  /^timeout expired$/i, // node-postgres connectionTimeoutMillis
  /Client has encountered a connection error and is not queryable/i,
  /Timeout acquiring a connection\. The pool is probably full/i, // knex KnexTimeoutError
  /^database "[^"]*" is not currently accepting connections$/i, // 55000 while `npm run db:restore` swaps databases
];

function isSqlState(code: unknown): code is string {
  return typeof code === 'string' && /^[0-9A-Z]{5}$/.test(code);
}

/**
 * True when `error` (or an error it wraps through `cause` or AggregateError's `errors`) means the
 * database could not be reached or dropped the connection: MikroORM's ConnectionException, a
 * driver error with a connection SQLSTATE (08xxx, 57P01–57P03, 53300) or, raised through the
 * database driver, a socket error (ECONNREFUSED, ECONNRESET, ETIMEDOUT, …), node-postgres'
 * "Connection terminated …", and knex's "Timeout acquiring a connection".
 *
 * Socket codes count only inside a MikroORM DriverException, so an unreachable mail server
 * (nodemailer also says ECONNREFUSED) is never reported as a database outage.
 *
 * @example
 * isDatabaseUnavailableError(new DriverException(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:54329'), { code: 'ECONNREFUSED' }))) // true
 * isDatabaseUnavailableError(Object.assign(new Error('duplicate key'), { code: '23505' })) // false
 */
export function isDatabaseUnavailableError(error: unknown, viaDriver = false, depth = 0): boolean {
  if (depth > 8 || error === null || typeof error !== 'object') return false;
  if (error instanceof HttpException) return false;
  if (error instanceof ConnectionException) return true;
  const e = error as { name?: unknown; code?: unknown; message?: unknown; cause?: unknown; errors?: unknown; severity?: unknown };
  const driver = viaDriver || error instanceof DriverException;
  if (e.name === 'KnexTimeoutError') return true;
  if (isSqlState(e.code) && (driver || typeof e.severity === 'string') && (e.code.startsWith('08') || UNAVAILABLE_SQLSTATES.has(e.code))) return true;
  if (driver && typeof e.code === 'string' && SOCKET_CODES.has(e.code)) return true;
  if (typeof e.message === 'string' && UNAVAILABLE_MESSAGES.some((pattern) => pattern.test(e.message as string))) return true;
  if (Array.isArray(e.errors) && e.errors.some((inner) => isDatabaseUnavailableError(inner, driver, depth + 1))) return true;
  return isDatabaseUnavailableError(e.cause, driver, depth + 1);
}

/**
 * Matches, through `instanceof`, exactly the errors `isDatabaseUnavailableError` accepts. Used as the
 * filter's @Catch type so that every other error goes on to the other filters and Nest's default
 * handling, whatever order the global filters are registered in.
 */
export abstract class DatabaseUnavailable {
  static [Symbol.hasInstance](value: unknown): boolean {
    return isDatabaseUnavailableError(value);
  }
}

/**
 * Global filter: a request that fails because the database is down, restarting or refusing
 * connections answers 503 `{ statusCode, code: 'database_unavailable', message }` with
 * `Retry-After`, instead of a 500 — and the server keeps running, so the next request after the
 * database is back succeeds (the pool opens fresh connections). Logged once per failure without
 * connection details beyond the driver's message (no credentials are part of it).
 */
@Catch(DatabaseUnavailable)
export class DatabaseUnavailableFilter implements ExceptionFilter {
  private readonly logger = new Logger('Database');

  catch(exception: unknown, host: ArgumentsHost): void {
    const error = exception as { name?: string; code?: string; message?: string };
    this.logger.warn(`request failed, database unavailable: ${error.name ?? 'Error'}${error.code ? ` ${error.code}` : ''}: ${String(error.message ?? '').split('\n')[0]}`);
    const res = host.switchToHttp().getResponse<Response>();
    if (res.headersSent) {
      res.end();
      return;
    }
    const body: DatabaseUnavailableBody = { statusCode: HttpStatus.SERVICE_UNAVAILABLE, code: 'database_unavailable', message: DATABASE_UNAVAILABLE_MESSAGE };
    res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS));
    res.status(HttpStatus.SERVICE_UNAVAILABLE).json(body);
  }
}
