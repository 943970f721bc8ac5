import {
  ConnectionAcquireTimeoutError,
  ConnectionRefusedError,
  DatabaseError,
  UniqueConstraintError,
} from 'sequelize';
import { describe, expect, test, vi } from 'vitest';
import { errorResponse } from '@/lib/api/handler';
import { DATABASE_UNAVAILABLE_MESSAGE, isDatabaseUnavailable } from '@/lib/database-unavailable';
import { AppError } from '@/lib/errors';

/** A pg error as pg hands it to Sequelize: a message, an SQLSTATE code when the server sent one, the statement. */
const pgError = (message: string, code?: string) =>
  Object.assign(new Error(message), { ...(code ? { code } : {}), sql: 'select 1', parameters: [] });

// SQLSTATE codes from the PostgreSQL 15 manual, Appendix A (PostgreSQL Error Codes).
describe('telling a lost database from a refused statement', () => {
  test.each([
    [
      'no connection could be made (server down)',
      new ConnectionRefusedError(pgError('connect ECONNREFUSED 127.0.0.1:54331')),
    ],
    [
      'no connection free in the pool in time',
      new ConnectionAcquireTimeoutError(pgError('Operation timeout')),
    ],
    [
      'fast shutdown ended the session (57P01 admin_shutdown)',
      new DatabaseError(pgError('terminating connection due to administrator command', '57P01')),
    ],
    [
      'a crashed server ended the session (57P02 crash_shutdown)',
      new DatabaseError(
        pgError('terminating connection because of crash of another server process', '57P02'),
      ),
    ],
    [
      'the server is still starting (57P03 cannot_connect_now)',
      new DatabaseError(pgError('the database system is starting up', '57P03')),
    ],
    [
      'the connection failed (08006 connection_failure)',
      new DatabaseError(pgError('connection failure', '08006')),
    ],
    ['pg lost the socket under a query', new DatabaseError(pgError('Connection terminated unexpectedly'))],
    [
      'pg refuses a client whose connection broke',
      new DatabaseError(pgError('Client has encountered a connection error and is not queryable')),
    ],
  ])('%s: unavailable', (_label, error) => {
    expect(isDatabaseUnavailable(error)).toBe(true);
  });

  test.each([
    [
      'a unique violation (23505)',
      new UniqueConstraintError({
        parent: pgError('duplicate key value violates unique constraint', '23505') as never,
      }),
    ],
    ['a syntax error (42601)', new DatabaseError(pgError('syntax error at or near "selec"', '42601'))],
    [
      'a cancelled statement (57014 query_canceled, not class 57P)',
      new DatabaseError(pgError('canceling statement due to statement timeout', '57014')),
    ],
    ['an error of Gatewell', new AppError('invalid', 'Bad value.')],
    ['any other error', new Error('Connection terminated unexpectedly')],
  ])('%s: not unavailable', (_label, error) => {
    expect(isDatabaseUnavailable(error)).toBe(false);
  });

  test('route handlers answer a lost database with 503 and a message that says nothing changed', async () => {
    const log = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const response = errorResponse(
      new ConnectionRefusedError(pgError('connect ECONNREFUSED 127.0.0.1:54331')),
    );
    expect(response.status).toBe(503);
    expect(await response.json()).toEqual({ error: 'unavailable', message: DATABASE_UNAVAILABLE_MESSAGE });
    expect(DATABASE_UNAVAILABLE_MESSAGE).toBe(
      'Gatewell cannot reach its database just now, so nothing was changed. Try again in a minute.',
    );
    expect(log).toHaveBeenCalledOnce();
    log.mockRestore();
  });
});
