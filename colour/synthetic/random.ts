// A small seeded random source, so every synthetic photo is repeatable.

/** Seeded uniform and normal random numbers (mulberry32, a public-domain 32-bit generator). */
export interface Random {
  /** Uniform in [0, 1). */
  next(): number;
  /** Approximately standard normal (sum of four uniforms, rescaled: cheap and smooth enough for noise). */
  normal(): number;
}

/** A seeded generator (mulberry32, a public-domain 32-bit generator by T. Ettinger). */
export function seededRandom(seed: number): Random {
  let s = seed | 0;
  const next = () => {
    s = (s + 0x6d2b79f5) | 0;
    let t = Math.imul(s ^ (s >>> 15), 1 | s);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  // The sum of four U(0,1) has mean 2 and variance 4/12 = 1/3.
  const normal = () => (next() + next() + next() + next() - 2) * Math.sqrt(3);
  return { next, normal };
}

/** A repeatable hash of two integers to [0, 1), for textures that must not depend on drawing order. */
export function hash2(a: number, b: number, seed: number): number {
  let h = Math.imul(a | 0, 0x27d4eb2d) ^ Math.imul(b | 0, 0x165667b1) ^ Math.imul(seed | 0, 0x9e3779b1);
  h = Math.imul(h ^ (h >>> 15), 0x85ebca6b);
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
  return ((h ^ (h >>> 16)) >>> 0) / 4294967296;
}
