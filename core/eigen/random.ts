/**
 * A small seeded generator (mulberry32, a public-domain 32-bit generator by T. Ettinger) so start
 * vectors are reproducible without `Math.random`.
 * `skip` starts it as if that many numbers had been drawn already.
 * @example const rand = seededRandom(7); rand() // in [0, 1)
 */
export function seededRandom(seed: number, skip = 0): () => number {
  // the state steps by a constant per draw, so skipping k draws is one multiplication
  let a = (((seed | 0) ^ 0x9e3779b9) + Math.imul(skip | 0, 0x6d2b79f5)) | 0;
  return () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
