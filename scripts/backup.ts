/**
 * `npm run backup -- [--out FILE] [--data-dir DIR]`: makes an online backup of the SQLite archive while
 * the service runs and verifies it (src/storage/sqlite/backup.ts), then prints the report as one JSON
 * line. Exit 0 = a verified backup exists at FILE; 1 = the backup or its checks failed (no file is left);
 * 2 = wrong usage (e.g. the service is configured for PostgreSQL: use pg_dump, docs/operations.md).
 *
 * DIR defaults to the configured data directory (TROPODELAY_DATA_DIR); FILE to
 * DIR/backups/tropodelay-<UTC time>.sqlite.
 */

import { mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { parseArgs } from 'node:util';
import { ConfigError, loadConfig } from '../src/config.js';
import { BackupError, backupSqliteArchive } from '../src/storage/sqlite/backup.js';
import { SQLITE_FILE_NAME } from '../src/storage/sqlite/sqlite-repository.js';

function usage(message: string): never {
  process.stderr.write(`backup: ${message}\nusage: npm run backup -- [--out FILE] [--data-dir DIR]\n`);
  process.exit(2);
}

async function main(): Promise<void> {
  let args;
  try {
    args = parseArgs({ options: { out: { type: 'string' }, 'data-dir': { type: 'string' } }, strict: true }).values;
  } catch (err) {
    usage((err as Error).message);
  }
  let dataDir = args['data-dir'];
  if (dataDir === undefined) {
    try {
      const config = loadConfig();
      if (config.DATABASE_URL) usage('the service is configured for PostgreSQL: back it up with pg_dump (docs/operations.md, "Backups")');
      dataDir = config.TROPO_DATA_DIR;
    } catch (err) {
      if (err instanceof ConfigError) usage(err.message);
      throw err;
    }
  }
  const stamp = new Date().toISOString().replace(/[:.]/g, '-');
  const out = args.out ?? join(dataDir, 'backups', `tropodelay-${stamp}.sqlite`);
  mkdirSync(dirname(out), { recursive: true });
  try {
    const report = await backupSqliteArchive(join(dataDir, SQLITE_FILE_NAME), out);
    process.stdout.write(`${JSON.stringify(report)}\n`);
  } catch (err) {
    if (err instanceof BackupError) {
      process.stderr.write(`backup: ${err.message}\n`);
      process.exit(1);
    }
    throw err;
  }
}

await main();
