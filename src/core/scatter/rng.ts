/**
 * Seeded pseudo-random numbers for the scatter module: xoshiro128** with SplitMix32 seeding.
 *
 * Generator: D. Blackman & S. Vigna, "Scrambled linear pseudorandom number generators", ACM Trans.
 * Math. Softw. 47 (2021), generator xoshiro128** (state 128 bit, period 2¹²⁸ − 1, 32-bit output).
 * Seeding: each 32-bit state word from SplitMix32 (the 32-bit variant of Steele, Lea & Flood,
 * "Fast splittable pseudorandom number generators", OOPSLA 2014), so that nearby seeds give
 * unrelated states; the state is never all zero.
 *
 * Why hand-written: the registry's seeded generators in this tree are d3-random's `randomLcg`
 * (a 32-bit LCG, period 2³² — too short for 10⁶ samples × several normals per sample split into
 * streams) and pure-rand (a dev-only dependency of fast-check, whose per-draw immutable API
 * allocates). The generator is 20 lines, allocation-free, and tested for uniformity in
 * test/core/scatter/rng.test.ts.
 */

/** A seeded source of uniform numbers; pure state, no clock. */
export interface Rng {
  /** Next 32-bit unsigned integer. */
  nextU32(): number;
  /** Next double uniform on [0, 1) with 53 random bits. */
  nextFloat(): number;
}

/** SplitMix32 step: returns [output, next state]. Constants from the 32-bit finaliser of MurmurHash3 variants (common practice). */
function splitmix32(state: number): [number, number] {
  const s = (state + 0x9e3779b9) | 0;
  let z = s;
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
  z ^= z >>> 16;
  return [z >>> 0, s];
}

/**
 * A xoshiro128** generator for stream `stream` of seed `seed`: the state is seeded from SplitMix32
 * over (seed, stream), so every stream (e.g. one per block of samples) is independent of how many
 * workers compute it.
 * Units: none. Valid range: seed and stream integers in [0, 2³² − 1].
 * @example const r = xoshiro128ss(42, 0); r.nextFloat() // a number in [0, 1)
 */
export function xoshiro128ss(seed: number, stream = 0): Rng {
  let st = (seed >>> 0) ^ Math.imul(stream >>> 0, 0x632be5ab);
  // Mix the stream in once more so (seed, stream) and (seed ^ x, stream') rarely collide.
  let o: number;
  [o, st] = splitmix32(st);
  st = (o ^ (stream >>> 0)) | 0;
  let a: number, b: number, c: number, d: number;
  [a, st] = splitmix32(st);
  [b, st] = splitmix32(st);
  [c, st] = splitmix32(st);
  [d, st] = splitmix32(st);
  if ((a | b | c | d) === 0) a = 1;
  let s0 = a | 0, s1 = b | 0, s2 = c | 0, s3 = d | 0;
  const nextU32 = (): number => {
    const m = Math.imul(s1, 5);
    const result = Math.imul((m << 7) | (m >>> 25), 9);
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = (s3 << 11) | (s3 >>> 21);
    return result >>> 0;
  };
  return {
    nextU32,
    // 27 + 26 bits → 53-bit double in [0, 1) (the usual construction of a double from two words).
    nextFloat: () => ((nextU32() >>> 5) * 67108864 + (nextU32() >>> 6)) / 9007199254740992,
  };
}
