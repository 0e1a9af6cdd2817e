/**
 * src/malloc-heap.ts: after raiseMallocThresholds(), heap blocks freed together stay with the process, so the
 * next round of allocations does not fault its pages in again. Reference: mallopt(3), M_MMAP_THRESHOLD and
 * M_TRIM_THRESHOLD (glibc's dynamic thresholds; from memory). The pattern is the event loop's: blocks written,
 * then freed all at once (as the worker's collector frees the body chunks moved to it). Each case runs in a
 * fresh child process (malloc-heap.child.ts), since the thresholds are the process's own; minor page faults
 * from process.resourceUsage(). glibc only: another C library has no such thresholds.
 *
 * Blocks of 200 kB, 40 MB a round: above glibc's default mmap threshold (128 kB), so without the call the first
 * free raises the thresholds to only ~200 kB / 400 kB and every round of 40 MB goes back to the kernel. (The
 * service's own pattern, 64 kB blocks and ~12.5 MB freed together, does not tell in a child run under tsx,
 * whose start-up already leaves the thresholds above it: ~70 faults in five rounds without the call.)
 */

import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';

const glibc = (process.report.getReport() as { header?: { glibcVersionRuntime?: string } }).header?.glibcVersionRuntime;

/** Pages of one round (malloc-heap.child.ts: 200 blocks of 200 kB). */
const PAGES_A_ROUND = (200 * 200_000) / 4096;

/** Minor page faults of rounds 2–6 (the first round faults its pages in either way), in a fresh process. */
function faultsAfterFirstRound(raise: boolean): number {
  const child = spawnSync(
    process.execPath,
    ['--import', 'tsx', new URL('./malloc-heap.child.ts', import.meta.url).pathname, raise ? '1' : '0'],
    {
      encoding: 'utf8',
    },
  );
  if (child.status !== 0) throw new Error(child.stderr);
  return Number(child.stdout);
}

describe.skipIf(!glibc)('raiseMallocThresholds: mallopt(3), dynamic mmap and trim thresholds', () => {
  it('blocks freed together are kept: the next rounds fault (almost) no page in again', () => {
    // Without it the trim threshold (twice the largest mapped block freed so far) is below a round's 40 MB, so
    // every round's pages go back to the kernel and fault in again (5 rounds ≈ 48 800 faults, measured); with it
    // the trim threshold is 64 MB (measured: 30–70 faults).
    const before = faultsAfterFirstRound(false);
    const after = faultsAfterFirstRound(true);
    expect(before).toBeGreaterThan(2 * PAGES_A_ROUND);
    expect(after).toBeLessThan(PAGES_A_ROUND / 4);
  });
});
