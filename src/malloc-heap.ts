/**
 * Keeps the C library's heap from being handed back to the kernel after every request (glibc only).
 *
 * Node's HTTP parser copies every body chunk it reads into a fresh malloc'd buffer (≤ 64 kB each, ~36 for the
 * 2.3 MB GPS-like day); the estimation routes move those buffers to a worker thread, whose collector frees them
 * several requests' worth at a time. With glibc's default thresholds (M_TRIM_THRESHOLD 128 kB, raised to twice
 * the largest mmap'd block freed so far, a few MB here) the freed top of the heap went back to the kernel
 * (`brk`), and the next request's chunks faulted every page in again, zero-filled by the kernel: 100–550 page
 * faults and ~1 ms of the event loop's CPU a request, depending on how the frees fell (bench/edge-threads.ts).
 *
 * glibc raises its thresholds by itself when a block allocated by mmap is freed: mallopt(3), M_MMAP_THRESHOLD,
 * "dynamic mmap threshold": the mmap threshold becomes the freed block's size and the trim threshold twice
 * that, for blocks up to DEFAULT_MMAP_THRESHOLD_MAX (32 MiB on 64-bit systems). Freeing one such block at
 * start-up therefore sets the thresholds a long-running server wants (as `MALLOC_MMAP_THRESHOLD_` and
 * `MALLOC_TRIM_THRESHOLD_` in the environment would, which a process cannot set for itself once running):
 * blocks up to 32 MiB come from the heap, and up to 64 MiB of free heap top is kept for the next request.
 * Blocks above 32 MiB (a 30-day body) are still mapped and unmapped on their own. Another C library ignores
 * the block: it is allocated and freed, nothing else.
 */

import { MessageChannel } from 'node:worker_threads';

/** The largest block whose free moves glibc's dynamic thresholds (DEFAULT_MMAP_THRESHOLD_MAX, 64-bit) [bytes]. */
export const MMAP_THRESHOLD_MAX_BYTES = 32 * 1024 * 1024;

/**
 * Allocates one block just under 32 MiB (glibc maps it: above any threshold so far; calloc'd mmap memory is not
 * touched, so it costs no resident memory) and frees it at once: moved into a message to a closed port, which
 * drops it (the collector would free it only at its next mark).
 */
export function raiseMallocThresholds(): void {
  // The chunk glibc maps is the request plus its header, rounded up to a page: stay a page below the maximum.
  const block = new ArrayBuffer(MMAP_THRESHOLD_MAX_BYTES - 2 * 4096);
  const { port1, port2 } = new MessageChannel();
  port2.close();
  port1.postMessage(block, [block]);
  port1.close();
}
