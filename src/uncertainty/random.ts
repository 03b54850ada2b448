/**
 * Seeded random numbers that do not depend on how a sweep is split: every realisation draws from its
 * own stream, keyed by (seed, realisation index, stream name), so realisation k is the same whether it
 * runs alone, in a batch of its neighbours or in one whole run.
 *
 * Generator: xoshiro128** (Blackman & Vigna 2018, "Scrambled linear pseudorandom number generators"),
 * seeded through SplitMix32-style mixing of the key (Steele, Lea & Flood 2014, the 32-bit finaliser of
 * MurmurHash3). Normal deviates by the polar form of the Box–Muller transform (Box & Muller 1958; Marsaglia & Bray 1964).
 */

/** MurmurHash3's 32-bit finaliser: a bijective mix. */
function mix32(h: number): number {
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

function hashKey(seed: number, index: number, stream: string): number {
  let h = mix32((seed >>> 0) ^ 0x9e3779b9);
  h = mix32(h ^ Math.imul(index >>> 0, 0x85ebca6b));
  for (let c = 0; c < stream.length; c++) h = mix32(h ^ stream.charCodeAt(c));
  return h;
}

export interface Rng {
  /** Uniform in [0, 1), 32 bits. */
  uniform(): number;
  /** Standard normal. */
  normal(): number;
}

export function rng(seed: number, index: number, stream: string): Rng {
  let x = hashKey(seed, index, stream);
  const next32 = () => {
    x = (x + 0x9e3779b9) >>> 0;
    return mix32(x);
  };
  let s0 = next32();
  let s1 = next32();
  let s2 = next32();
  let s3 = next32();
  if ((s0 | s1 | s2 | s3) === 0) s0 = 1;
  const nextU32 = (): number => {
    const r = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = rotl(s3, 11);
    return r;
  };
  let spare: number | null = null;
  const uniform = () => nextU32() / 4294967296;
  return {
    uniform,
    normal() {
      if (spare !== null) {
        const v = spare;
        spare = null;
        return v;
      }
      // Marsaglia's polar form of Box–Muller (Marsaglia & Bray 1964): no trigonometry
      let u: number, v: number, s: number;
      do {
        u = 2 * uniform() - 1;
        v = 2 * uniform() - 1;
        s = u * u + v * v;
      } while (s >= 1 || s === 0);
      const f = Math.sqrt((-2 * Math.log(s)) / s);
      spare = v * f;
      return u * f;
    },
  };
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}
