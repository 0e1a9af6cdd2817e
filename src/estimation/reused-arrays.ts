/**
 * Where the estimator's per-request typed arrays come from: fresh (`FRESH_ARRAYS`, the default of every
 * function that takes an ArraySource), or the thread's reused buffers (`threadArrays`, which only
 * estimateZwd passes, issue 14). Typed arrays live outside the V8 heap (malloc or mmap per array, zeroed,
 * swept by the garbage collector, counted as external memory); a warm GPS-like request allocated ~4.5 MB
 * of them in ~60 arrays. Reused, the next request that fits writes into the same memory.
 *
 * Every array handed out is zero-filled, as `new Float64Array(n)` is, so the code that takes them relies on
 * nothing else. A role names one array of one estimation: the same role is never asked for twice while its
 * first array is still in use (roles are per call site, and an estimation runs to its end before the next
 * starts: estimateZwd is synchronous). Nothing an estimation returns may be such an array (the output is
 * objects and numbers): a result never sees a later request's numbers (test/estimation/reused-arrays.test.ts).
 * A thrown estimation leaves only stale numbers behind, which the next one's zero-fill clears.
 *
 * The thread keeps at most REUSED_ARRAY_BUDGET_BYTES (a four-constellation day fits, ~12 MB); an array that
 * does not fit in what is left is fresh, as before, and garbage after its request (a 30-day request's
 * arrays are not held by an idle thread).
 */

/** The typed arrays of one estimation, by role. */
export interface ArraySource {
  float64(role: string, length: number): Float64Array;
  int32(role: string, length: number): Int32Array;
  uint8(role: string, length: number): Uint8Array;
  uint16(role: string, length: number): Uint16Array;
}

/** A new zero-filled array for every request (what the code did before, and what the network estimator uses). */
export const FRESH_ARRAYS: ArraySource = {
  float64: (_role, length) => new Float64Array(length),
  int32: (_role, length) => new Int32Array(length),
  uint8: (_role, length) => new Uint8Array(length),
  uint16: (_role, length) => new Uint16Array(length),
};

/** Bytes of reused arrays one thread keeps at most. */
export const REUSED_ARRAY_BUDGET_BYTES = 16 * 1024 * 1024;

/** Buffers grow in steps of this many bytes, so that slightly larger requests find room. */
const GROWTH_STEP_BYTES = 64 * 1024;

/** One buffer per role, kept while the total stays within the budget. */
export class ReusedArrays implements ArraySource {
  private readonly buffers = new Map<string, ArrayBuffer>();
  private heldBytes = 0;

  constructor(private readonly budgetBytes: number) {}

  /** Bytes held between estimations (for the tests). */
  get held(): number {
    return this.heldBytes;
  }

  float64(role: string, length: number): Float64Array {
    const buffer = this.buffer(role, length * 8);
    return buffer ? new Float64Array(buffer, 0, length).fill(0) : new Float64Array(length);
  }

  int32(role: string, length: number): Int32Array {
    const buffer = this.buffer(role, length * 4);
    return buffer ? new Int32Array(buffer, 0, length).fill(0) : new Int32Array(length);
  }

  uint8(role: string, length: number): Uint8Array {
    const buffer = this.buffer(role, length);
    return buffer ? new Uint8Array(buffer, 0, length).fill(0) : new Uint8Array(length);
  }

  uint16(role: string, length: number): Uint16Array {
    const buffer = this.buffer(role, length * 2);
    return buffer ? new Uint16Array(buffer, 0, length).fill(0) : new Uint16Array(length);
  }

  /** The role's buffer with room for `bytes`, grown if the budget allows; null: use a fresh array. */
  private buffer(role: string, bytes: number): ArrayBuffer | null {
    const current = this.buffers.get(role);
    if (current && current.byteLength >= bytes) return current;
    const size = Math.ceil(bytes / GROWTH_STEP_BYTES) * GROWTH_STEP_BYTES;
    const others = this.heldBytes - (current?.byteLength ?? 0);
    if (others + size > this.budgetBytes) return null;
    const grown = new ArrayBuffer(size);
    this.buffers.set(role, grown);
    this.heldBytes = others + size;
    return grown;
  }
}

/** This thread's reused arrays (a module instance per worker thread, so one per thread). */
export const threadArrays: ArraySource = new ReusedArrays(REUSED_ARRAY_BUDGET_BYTES);
