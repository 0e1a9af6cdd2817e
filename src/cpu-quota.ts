/**
 * The CPU quota of the container the service runs in, from the Linux control groups: cgroup v2
 * `cpu.max` ("<quota> <period>" in µs, or "max <period>" for none) of the process's own group
 * (/proc/self/cgroup line "0::<path>"), else cgroup v1 `cpu.cfs_quota_us` / `cpu.cfs_period_us`
 * (quota -1 for none). Linux kernel documentation, "Control Group v2", section "CPU Interface Files"
 * (cpu.max), and "CFS Bandwidth Control" (cfs_quota_us, cfs_period_us) — from memory.
 *
 * A container started with `--cpus 1.5` has quota 150000 per period 100000, i.e. 1.5 cores. The default
 * worker count (ESTIMATION_WORKERS) follows that quota rather than the host's core count, so that two
 * worker threads per host core do not fight over a quota of one.
 */

import { readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';

/** Reads a small text file, or undefined when it does not exist or cannot be read. */
export type ReadText = (path: string) => string | undefined;

const readIfPresent: ReadText = (path) => {
  try {
    return readFileSync(path, 'utf8');
  } catch {
    return undefined;
  }
};

function v2Quota(read: ReadText): number | undefined {
  const ownGroup = read('/proc/self/cgroup')
    ?.split('\n')
    .find((l) => l.startsWith('0::'))
    ?.slice(3)
    .trim();
  const candidates =
    ownGroup && ownGroup !== '/' ? [`/sys/fs/cgroup${ownGroup}/cpu.max`, '/sys/fs/cgroup/cpu.max'] : ['/sys/fs/cgroup/cpu.max'];
  for (const path of candidates) {
    const text = read(path)?.trim();
    if (!text) continue;
    const [quota, period] = text.split(/\s+/);
    if (quota === 'max') return undefined;
    const q = Number(quota);
    const p = Number(period);
    if (Number.isFinite(q) && Number.isFinite(p) && q > 0 && p > 0) return q / p;
  }
  return undefined;
}

function v1Quota(read: ReadText): number | undefined {
  for (const dir of ['/sys/fs/cgroup/cpu', '/sys/fs/cgroup/cpu,cpuacct']) {
    const quota = Number(read(`${dir}/cpu.cfs_quota_us`)?.trim());
    const period = Number(read(`${dir}/cpu.cfs_period_us`)?.trim());
    if (Number.isFinite(quota) && Number.isFinite(period) && period > 0) return quota > 0 ? quota / period : undefined;
  }
  return undefined;
}

/** CPU quota of this process's control group [cores, may be fractional], or undefined when none is set. */
export function cpuQuotaCores(read: ReadText = readIfPresent): number | undefined {
  return v2Quota(read) ?? v1Quota(read);
}

/**
 * Default number of estimation workers: the CPU quota rounded up (at least 1), never more than the
 * cores this process may run on; the core count when no quota is set.
 */
export function defaultWorkerCount(read: ReadText = readIfPresent, cores: number = availableParallelism()): number {
  const quota = cpuQuotaCores(read);
  return quota === undefined ? cores : Math.max(1, Math.min(cores, Math.ceil(quota)));
}
