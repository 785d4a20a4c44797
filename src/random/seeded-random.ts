// Seeded pseudo-random numbers: the mulberry32 generator (a small 32-bit mixing generator; common practice
// for reproducible test noise and procedural content, not for cryptography).

/** A generator of uniform numbers in [0, 1) from a 32-bit seed; the same seed gives the same sequence. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
