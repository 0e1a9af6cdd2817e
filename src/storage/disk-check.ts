/**
 * Is the data directory writable with room to spare? For GET /v1/ready: a replica whose disk is full
 * or was remounted read-only would answer every write with 503, so the load balancer should send
 * writes elsewhere. Two checks: free space (statfs) above a floor, and a real write (create, write,
 * fsync, remove a small probe file), which also catches a read-only mount and a lost permission.
 */

import { randomBytes } from 'node:crypto';
import { open, rm, statfs } from 'node:fs/promises';
import { join } from 'node:path';
import { StorageUnavailableError } from './errors.js';

export interface DiskCheckOptions {
  /** The directory to check. */
  dir: string;
  /** Free space below which the directory counts as full [bytes]; 0 = no floor. */
  minFreeBytes: number;
}

/** Resolves when the directory has room and takes a write; throws StorageUnavailableError otherwise. */
export async function checkDataDir({ dir, minFreeBytes }: DiskCheckOptions): Promise<void> {
  if (minFreeBytes > 0) {
    const fs = await statfs(dir);
    // bavail: blocks available to an unprivileged user (what the database can still grow into).
    const freeBytes = fs.bavail * fs.bsize;
    if (freeBytes < minFreeBytes) throw new StorageUnavailableError('disk-full');
  }
  const probe = join(dir, `.ready-probe-${randomBytes(4).toString('hex')}`);
  try {
    const handle = await open(probe, 'w');
    try {
      await handle.write('ready\n');
      await handle.sync();
    } finally {
      await handle.close();
    }
  } catch (err) {
    const code = (err as { code?: string }).code;
    throw new StorageUnavailableError(code === 'ENOSPC' || code === 'EDQUOT' ? 'disk-full' : 'read-only', { cause: err });
  } finally {
    await rm(probe, { force: true }).catch(() => undefined);
  }
}
