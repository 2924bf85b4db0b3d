/**
 * Seeded random numbers for sweep draws. The generator is xoshiro128** (D. Blackman and S. Vigna,
 * "Scrambled linear pseudorandom number generators", ACM Trans. Math. Softw. 47(4), 2021; the
 * reference C code is the authors' xoshiro128starstar.c), with its 128-bit state filled by
 * SplitMix32 (the 32-bit variant of Steele, Lea and Flood's SplitMix, OOPSLA 2014), as the
 * authors recommend for seeding. Normal deviates use the Box-Muller transform (G. E. P. Box and
 * M. E. Muller, Ann. Math. Statist. 29(2), 610-611, 1958).
 */

/** A stream of pseudo-random numbers; every method advances the stream. */
export interface Random {
  /** Next unsigned 32-bit integer. */
  nextUint32(): number;
  /** Next double, uniform on [0, 1), with 53 random bits. */
  uniform(): number;
  /** Next standard normal deviate (mean 0, standard deviation 1). */
  normal(): number;
}

/**
 * Creates a xoshiro128** stream from a 32-bit seed.
 * @param seed any integer (taken modulo 2^32).
 * @returns a Random stream; the same seed always gives the same numbers.
 * @example createRandom(1).nextUint32() // the same value on every machine
 */
export function createRandom(seed: number): Random {
  let sm = seed >>> 0;
  const splitmix = (): number => {
    sm = (sm + 0x9e3779b9) >>> 0;
    let z = sm;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return (z ^ (z >>> 16)) >>> 0;
  };
  const s = new Uint32Array(4);
  for (let i = 0; i < 4; i++) s[i] = splitmix();
  if ((s[0] | s[1] | s[2] | s[3]) === 0) s[0] = 1; // the all-zero state is a fixed point
  const rotl = (x: number, k: number): number => ((x << k) | (x >>> (32 - k))) >>> 0;
  const nextUint32 = (): number => {
    const result = Math.imul(rotl(Math.imul(s[1], 5) >>> 0, 7), 9) >>> 0;
    const t = (s[1] << 9) >>> 0;
    s[2] ^= s[0];
    s[3] ^= s[1];
    s[1] ^= s[2];
    s[0] ^= s[3];
    s[2] ^= t;
    s[3] = rotl(s[3], 11);
    return result;
  };
  const uniform = (): number => {
    // 27 high bits and 26 high bits make a 53-bit mantissa (the usual double construction).
    const a = nextUint32() >>> 5;
    const b = nextUint32() >>> 6;
    return (a * 67108864 + b) / 9007199254740992;
  };
  let spare = NaN;
  const normal = (): number => {
    if (!Number.isNaN(spare)) {
      const z = spare;
      spare = NaN;
      return z;
    }
    // 1 - u is in (0, 1], so the logarithm is finite.
    const u1 = 1 - uniform();
    const u2 = uniform();
    const r = Math.sqrt(-2 * Math.log(u1));
    spare = r * Math.sin(2 * Math.PI * u2);
    return r * Math.cos(2 * Math.PI * u2);
  };
  return { nextUint32, uniform, normal };
}

/**
 * A 32-bit seed for one named stream, from the sweep's seed and the stream's name (FNV-1a over
 * the name, mixed with the seed), so that adding a parameter does not change the draws of others.
 * @param seed the sweep's seed.
 * @param name the parameter's name.
 * @example streamSeed(7, 'RL') !== streamSeed(7, 'Rs')
 */
export function streamSeed(seed: number, name: string): number {
  let h = 0x811c9dc5 ^ (seed >>> 0);
  for (let i = 0; i < name.length; i++) {
    h ^= name.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  h ^= Math.floor(seed / 4294967296) >>> 0;
  return h >>> 0;
}
