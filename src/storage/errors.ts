/**
 * Failures of the storage itself (not of the caller's request): the database cannot be reached, is
 * restarting, did not answer in time, the disk is full or read-only, or a write lost a lock conflict
 * after its retries. They are temporary from the caller's point of view, so the HTTP edge answers
 * 503 with a Retry-After; the driver's own text (host names, file paths, SQL) goes to the log only.
 *
 * Both backends throw raw driver errors from many places (a pool query, a statement, a commit);
 * `storageUnavailable()` recognises them by their codes, so no call site has to wrap anything.
 */

export type StorageFailure = 'unreachable' | 'timeout' | 'disk-full' | 'read-only' | 'busy' | 'conflict';

/** What the caller is told for each failure (public text: no driver detail). */
const PUBLIC_TEXT: Record<StorageFailure, string> = {
  unreachable: 'the database is not reachable right now',
  timeout: 'the database did not answer in time',
  'disk-full': 'the storage is full; nothing was written',
  'read-only': 'the storage is read-only right now; nothing was written',
  busy: 'the database is busy with other writes',
  conflict: 'the write conflicted with concurrent writes of the same records and was not stored',
};

/** Seconds a caller should wait before retrying, per failure (a hint; Retry-After). */
const RETRY_AFTER_S: Record<StorageFailure, number> = {
  unreachable: 5,
  timeout: 5,
  'disk-full': 60,
  'read-only': 60,
  busy: 1,
  conflict: 1,
};

export class StorageUnavailableError extends Error {
  readonly retryAfterS: number;
  constructor(
    readonly failure: StorageFailure,
    options?: { cause?: unknown },
  ) {
    super(PUBLIC_TEXT[failure], options);
    this.retryAfterS = RETRY_AFTER_S[failure];
  }
}

/**
 * PostgreSQL SQLSTATE classes and codes that mean "the server or the connection failed", not "the
 * statement is wrong" (PostgreSQL documentation, Appendix A "PostgreSQL Error Codes"):
 * 08 connection exception, 53 insufficient resources, 57P01..57P03 admin/crash shutdown and
 * cannot-connect-now, 58 system error, 25006 read-only transaction (a standby after failover).
 */
function pgFailure(code: string): StorageFailure | null {
  if (code === '57014') return 'timeout'; // query_canceled: statement_timeout or lock_timeout fired
  if (code === '55P03') return 'timeout'; // lock_not_available (lock_timeout)
  if (code === '25P03') return 'timeout'; // idle_in_transaction_session_timeout
  if (code === '40001' || code === '40P01') return 'conflict'; // serialization failure, deadlock (after retries)
  if (code === '25006') return 'read-only';
  if (code === '53100') return 'disk-full';
  if (code.startsWith('08') || code.startsWith('53') || code.startsWith('58') || /^57P0[1-3]$/.test(code)) return 'unreachable';
  return null;
}

/** Node's socket error codes on a database connection. */
const NETWORK_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'EHOSTUNREACH',
  'ENETUNREACH',
  'ENOTFOUND',
  'EAI_AGAIN',
  'ECONNABORTED',
]);

/** better-sqlite3's SqliteError codes (SQLite result codes, https://sqlite.org/rescode.html). */
function sqliteFailure(code: string): StorageFailure | null {
  if (code === 'SQLITE_FULL') return 'disk-full';
  if (code.startsWith('SQLITE_READONLY')) return 'read-only';
  if (code.startsWith('SQLITE_BUSY') || code.startsWith('SQLITE_LOCKED')) return 'busy';
  if (code.startsWith('SQLITE_IOERR') || code.startsWith('SQLITE_CANTOPEN')) return 'unreachable';
  return null;
}

/**
 * node-postgres reports some failures only by message: a connection that ended under a query, a
 * client-side query_timeout, a pool that waited connectionTimeoutMillis for a connection.
 */
const PG_MESSAGES: [RegExp, StorageFailure][] = [
  // first match wins: the timeout form before the general "Connection terminated"
  [/^Connection terminated due to connection timeout/i, 'timeout'],
  [/^Connection terminated/i, 'unreachable'],
  [/^Client has encountered a connection error and is not queryable/i, 'unreachable'],
  [/^Client was closed and is not queryable/i, 'unreachable'],
  [/^Query read timeout/i, 'timeout'],
  [/^timeout exceeded when trying to connect/i, 'timeout'],
];

function errorCode(err: unknown): string {
  const code = typeof err === 'object' && err !== null ? (err as { code?: unknown }).code : undefined;
  return typeof code === 'string' ? code : '';
}

/**
 * The StorageUnavailableError an error stands for, or null when it is something else (a bug, a
 * caller's mistake). Follows `cause` one level.
 */
export function storageUnavailable(err: unknown): StorageUnavailableError | null {
  if (err instanceof StorageUnavailableError) return err;
  if (!(err instanceof Error)) return null;
  const code = errorCode(err);
  let failure: StorageFailure | null = null;
  if (code.startsWith('SQLITE_')) failure = sqliteFailure(code);
  else if (NETWORK_CODES.has(code)) failure = 'unreachable';
  else if (/^[0-9A-Z]{5}$/.test(code)) failure = pgFailure(code);
  if (!failure) failure = PG_MESSAGES.find(([pattern]) => pattern.test(err.message))?.[1] ?? null;
  if (failure) return new StorageUnavailableError(failure, { cause: err });
  return err.cause !== undefined && err.cause !== err ? storageUnavailable(err.cause) : null;
}

/** Serialization failure or deadlock on PostgreSQL, busy on SQLite: the same write may succeed if run again. */
export function isRetryableConflict(err: unknown): boolean {
  const code = errorCode(err);
  return code === '40001' || code === '40P01' || code === 'SQLITE_BUSY' || code === 'SQLITE_BUSY_SNAPSHOT';
}

/**
 * Runs `attempt` and runs it again (at most `retries` more times, after a short random pause) when it
 * fails with a serialization failure or deadlock. The transaction of a failed attempt was rolled back
 * whole, so running it again is safe.
 */
export async function withConflictRetry<T>(attempt: () => Promise<T>, retries = 4): Promise<T> {
  for (let n = 0; ; n++) {
    try {
      return await attempt();
    } catch (err) {
      if (n >= retries || !isRetryableConflict(err)) throw err;
      // 5..25 ms, doubling: enough for the competing transaction to commit; random so two retries do not meet again.
      await new Promise((resolve) => setTimeout(resolve, (5 + Math.random() * 20) * 2 ** n));
    }
  }
}
