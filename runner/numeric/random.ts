/**
 * The one seeded PRNG every generator, sampler and initialiser uses (never Math.random):
 * xoshiro128** (Blackman & Vigna, "Scrambled linear pseudorandom number generators",
 * ACM TOMS 47(4), 2021), seeded through SplitMix32 so nearby seeds give unrelated streams.
 * Pure 32-bit integer arithmetic, so every machine yields the same numbers for a seed.
 */

export interface Rng {
  /** Uniform on [0, 1) with 32 bits of resolution. */
  next: () => number;
  /** Uniform integer in [0, n). */
  int: (n: number) => number;
  /** Standard normal (Box–Muller, polar-free form; one of the pair is cached). */
  normal: () => number;
  /** An independent stream derived from this one and a label (e.g. 'split', 'init'). */
  fork: (label: string) => Rng;
}

function splitmix32(state: number): () => number {
  let s = state >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = s;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return (z ^ (z >>> 16)) >>> 0;
  };
}

/** FNV-1a hash of a label, to derive fork seeds (common practice). */
function hashLabel(label: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < label.length; i++) {
    h ^= label.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h >>> 0;
}

/** Creates a generator from an integer seed (any safe integer; hashed to 32 bits). */
export function createRng(seed: number): Rng {
  const seeder = splitmix32((seed >>> 0) ^ Math.floor(seed / 2 ** 32));
  const s = new Uint32Array([seeder(), seeder(), seeder(), seeder()]);
  if ((s[0]! | s[1]! | s[2]! | s[3]!) === 0) s[0] = 1;
  let spare: number | null = null;

  const nextU32 = (): number => {
    const result = Math.imul(rotl(Math.imul(s[1]!, 5) >>> 0, 7), 9) >>> 0;
    const t = (s[1]! << 9) >>> 0;
    s[2] = s[2]! ^ s[0]!;
    s[3] = s[3]! ^ s[1]!;
    s[1] = s[1]! ^ s[2];
    s[0] = s[0]! ^ s[3];
    s[2] = s[2] ^ t;
    s[3] = rotl(s[3], 11);
    return result;
  };

  const rng: Rng = {
    next: () => nextU32() / 4294967296,
    int: (n) => Math.floor((nextU32() / 4294967296) * n),
    normal: () => {
      if (spare !== null) {
        const v = spare;
        spare = null;
        return v;
      }
      // Box & Muller (1958); 1 - u keeps the logarithm finite.
      const u = 1 - nextU32() / 4294967296;
      const v = nextU32() / 4294967296;
      const r = Math.sqrt(-2 * Math.log(u));
      spare = r * Math.sin(2 * Math.PI * v);
      return r * Math.cos(2 * Math.PI * v);
    },
    fork: (label) => createRng((nextU32() ^ hashLabel(label)) >>> 0),
  };
  return rng;
}

function rotl(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0;
}
