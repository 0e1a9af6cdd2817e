/** The PostgreSQL the benchmarks use (BENCH_DATABASE_URL, default the local test database), and whether it answers. */

import pg from 'pg';

export const BENCH_PG_URL = process.env.BENCH_DATABASE_URL ?? 'postgres://postgres@127.0.0.1:5432/test';

export async function pgAvailable(url = BENCH_PG_URL): Promise<boolean> {
  const client = new pg.Client({ connectionString: url, connectionTimeoutMillis: 2000 });
  try {
    await client.connect();
    await client.end();
    return true;
  } catch {
    return false;
  }
}
