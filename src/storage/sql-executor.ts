/**
 * A narrow door to the archive's database for stores that keep their own tables (the residual
 * deposits and campaigns of src/campaigns): reads, and a list of statements run in one transaction.
 * The SQL is written once with `?` placeholders in the subset both dialects share; PostgreSQL gets
 * them numbered (`$1`, `$2` …). BIGINT columns arrive as strings from PostgreSQL: readers convert.
 */

export interface SqlStatement {
  sql: string;
  params: readonly unknown[];
}

/**
 * A statement run first inside a write's transaction (Repository.writeDelays): when it changes no
 * row, the whole transaction is rolled back and the write throws GuardRefusedError. Campaign items
 * use it to mark an item done in the transaction that stores its results (exactly once).
 */
export type GuardStatement = SqlStatement;

export class GuardRefusedError extends Error {
  constructor() {
    super('the guard statement changed no row; nothing was written');
  }
}

export interface SqlExecutor {
  readonly dialect: 'sqlite' | 'postgres';
  /** The rows of one query, as objects keyed by column name. */
  all<T = Record<string, unknown>>(sql: string, params?: readonly unknown[]): Promise<T[]>;
  /** Runs the statements in one transaction (all or none); the changed-row count of each. */
  batch(statements: readonly SqlStatement[]): Promise<number[]>;
}

/** `?` placeholders → `$1`, `$2` … (the SQL of these stores has no `?` inside literals). */
export function numberedPlaceholders(sql: string): string {
  let n = 0;
  return sql.replace(/\?/g, () => `$${++n}`);
}
