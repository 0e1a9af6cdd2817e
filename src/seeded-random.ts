/**
 * Mulberry32 (T. Ettinger, public domain; common practice): a small seeded 32-bit generator, uniform in
 * [0, 1). One definition for the invented data of the workers' warm-up (src/http/tasks/warm-up.ts) and of the
 * generators in scripts/ and the tests (scripts/synthetic-residuals.ts re-exports it): the same seed gives the
 * same numbers everywhere. A leaf module: it imports nothing.
 */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
