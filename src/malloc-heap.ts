/**
 * Keeps the C library's heap from being handed back to the kernel after every request (glibc only).
 *
 * Node's HTTP parser copies every body chunk it reads into a fresh malloc'd buffer (≤ 64 kB each, ~36 for the
 * 2.3 MB GPS-like day); the estimation routes move those buffers to a worker thread, whose collector frees
 * several requests' worth at a time (a scavenge every ~3–4 requests there: ~7–9 MB, an estimate). glibc's trim
 * threshold is 128 kB at start and rises by itself to twice the largest mapped block freed so far: a few MB in
 * a service that has run GPS-like days. Then the freed top of the heap went back to the kernel, and the next
 * request's copies faulted every page in again, zero-filled by the kernel: 350–550 page faults and ~2 ms of
 * the event loop's CPU a request in that state (bench/edge-threads.ts), against 18–63 otherwise; whether a run
 * fell into it depended on how the frees fell.
 *
 * glibc raises its thresholds when a block it mapped (one above the mmap threshold) is freed: mallopt(3),
 * M_MMAP_THRESHOLD, "dynamic mmap threshold": the mmap threshold becomes the freed block's size and the trim
 * threshold twice that (for blocks up to 32 MiB on 64-bit systems). Freeing one block of 8 MiB at start-up sets
 * them to 8 and 16 MiB, as `MALLOC_MMAP_THRESHOLD_` and `MALLOC_TRIM_THRESHOLD_` in the environment would (which
 * a process cannot set for itself once running), without turning the dynamic thresholds off. 16 MiB is above
 * what the worker frees together for GPS-like days (measured: 4 / 8 MiB left the faults as they were); more
 * (32 MiB, a 64 MiB trim threshold) raised the peak resident set of the 30-day requests by ~50 MB, 8 MiB did not
 * (DEVELOPERS.md, "The event loop's heap between requests"). Another C library ignores the block: it is
 * allocated and freed, nothing else.
 */

import { MessageChannel } from 'node:worker_threads';

/** The block freed at start [bytes]: glibc's mmap threshold becomes this, its trim threshold twice this. */
export const MALLOC_THRESHOLD_BLOCK_BYTES = 8 * 1024 * 1024;

/**
 * Allocates one block of MALLOC_THRESHOLD_BLOCK_BYTES (glibc maps it, being above any threshold so far; mapped
 * memory comes zeroed, so calloc does not touch it: no resident memory) and frees it at once: moved into a
 * message to a closed port, which drops it (the collector would free it only at some later collection).
 */
export function raiseMallocThresholds(): void {
  const block = new ArrayBuffer(MALLOC_THRESHOLD_BLOCK_BYTES);
  const { port1, port2 } = new MessageChannel();
  port2.close();
  port1.postMessage(block, [block]);
  port1.close();
}
