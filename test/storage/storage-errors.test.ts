/**
 * Which driver errors are storage failures (503 + Retry-After) and which are not (they stay 500 or
 * their own 4xx). Codes from the PostgreSQL documentation, Appendix A "PostgreSQL Error Codes"
 * (SQLSTATE), and SQLite's result codes (https://sqlite.org/rescode.html, as better-sqlite3 names
 * them in SqliteError.code); node-postgres messages as its sources word them (pg 8, client.js and
 * pg-pool). A wrong entry in the classifier turns a database outage into a 500 or a bug into a 503.
 */

import { describe, expect, it } from 'vitest';
import { isRetryableConflict, storageUnavailable, withConflictRetry } from '../../src/storage/errors.js';

const withCode = (code: string, message = 'driver text') => Object.assign(new Error(message), { code });

describe('storageUnavailable: PostgreSQL SQLSTATE (Appendix A)', () => {
  it.each([
    ['08006', 'unreachable'], // connection_failure
    ['08001', 'unreachable'], // sqlclient_unable_to_establish_sqlconnection
    ['57P01', 'unreachable'], // admin_shutdown (pg_terminate_backend, fast shutdown)
    ['57P02', 'unreachable'], // crash_shutdown
    ['57P03', 'unreachable'], // cannot_connect_now (starting up, recovery)
    ['53300', 'unreachable'], // too_many_connections
    ['53100', 'disk-full'], // disk_full
    ['57014', 'timeout'], // query_canceled (statement_timeout)
    ['55P03', 'timeout'], // lock_not_available (lock_timeout)
    ['25006', 'read-only'], // read_only_sql_transaction (a standby)
    ['40P01', 'conflict'], // deadlock_detected (after the retries)
    ['40001', 'conflict'], // serialization_failure (after the retries)
  ])('%s → %s', (code, failure) => {
    expect(storageUnavailable(withCode(code))?.failure).toBe(failure);
  });

  it.each([
    ['23505'], // unique_violation: a bug, not an outage
    ['42P01'], // undefined_table
    ['22P02'], // invalid_text_representation
    ['57P04'], // database_dropped: class 57 but not a transient shutdown
  ])('%s is not a storage failure', (code) => {
    expect(storageUnavailable(withCode(code))).toBeNull();
  });
});

describe('storageUnavailable: node-postgres and socket errors', () => {
  it.each([
    [withCode('ECONNREFUSED', 'connect ECONNREFUSED 10.0.0.9:5432'), 'unreachable'],
    [withCode('ECONNRESET'), 'unreachable'],
    [new Error('Connection terminated unexpectedly'), 'unreachable'],
    [new Error('timeout exceeded when trying to connect'), 'timeout'],
    [new Error('Query read timeout'), 'timeout'],
    [new Error('Connection terminated due to connection timeout'), 'timeout'],
  ])('%s → %s', (err, failure) => {
    expect(storageUnavailable(err)?.failure).toBe(failure);
  });

  it('follows `cause`, and the public text carries no driver detail', () => {
    const wrapped = new Error('write failed', { cause: withCode('ECONNREFUSED', 'connect ECONNREFUSED 10.0.0.9:5432') });
    const e = storageUnavailable(wrapped)!;
    expect(e.failure).toBe('unreachable');
    expect(e.message).not.toMatch(/10\.0\.0\.9|ECONNREFUSED/);
    expect(e.retryAfterS).toBeGreaterThanOrEqual(1);
  });

  it('a plain bug is not a storage failure', () => {
    expect(storageUnavailable(new TypeError("Cannot read properties of undefined (reading 'rows')"))).toBeNull();
    expect(storageUnavailable('a string')).toBeNull();
  });
});

describe('storageUnavailable: SQLite result codes', () => {
  it.each([
    ['SQLITE_FULL', 'disk-full'],
    ['SQLITE_READONLY', 'read-only'],
    ['SQLITE_READONLY_DBMOVED', 'read-only'],
    ['SQLITE_BUSY', 'busy'],
    ['SQLITE_BUSY_SNAPSHOT', 'busy'],
    ['SQLITE_IOERR_WRITE', 'unreachable'],
    ['SQLITE_CANTOPEN', 'unreachable'],
  ])('%s → %s', (code, failure) => {
    expect(storageUnavailable(withCode(code))?.failure).toBe(failure);
  });

  it.each([['SQLITE_CONSTRAINT_FOREIGNKEY'], ['SQLITE_ERROR'], ['SQLITE_MISMATCH']])('%s is not a storage failure', (code) => {
    expect(storageUnavailable(withCode(code))).toBeNull();
  });
});

describe('withConflictRetry', () => {
  it('reruns a deadlocked attempt and returns the first success', async () => {
    let attempts = 0;
    const result = await withConflictRetry(async () => {
      attempts++;
      if (attempts < 3) throw withCode('40P01', 'deadlock detected');
      return 'stored';
    });
    expect(result).toBe('stored');
    expect(attempts).toBe(3);
  });

  it('gives up after the bounded number of retries and rethrows the conflict', async () => {
    let attempts = 0;
    await expect(
      withConflictRetry(async () => {
        attempts++;
        throw withCode('40001');
      }, 2),
    ).rejects.toMatchObject({ code: '40001' });
    expect(attempts).toBe(3);
  });

  it('never reruns other errors', async () => {
    let attempts = 0;
    await expect(
      withConflictRetry(async () => {
        attempts++;
        throw withCode('23505');
      }),
    ).rejects.toMatchObject({ code: '23505' });
    expect(attempts).toBe(1);
    expect(isRetryableConflict(withCode('SQLITE_BUSY'))).toBe(true);
    expect(isRetryableConflict(withCode('SQLITE_FULL'))).toBe(false);
  });
});
