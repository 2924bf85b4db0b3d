import { describe, expect, it } from 'vitest';
import { createRandom, parameterValues, streamSeed } from '../index.ts';

// Moment checks. For n independent draws the sample mean has standard deviation sigma/sqrt(n)
// (central limit theorem) and the sample standard deviation of a normal sample has standard
// error about sigma/sqrt(2(n-1)) (e.g. Kendall & Stuart, The Advanced Theory of Statistics,
// vol. 1, sampling distributions, from memory). A band of 3 of these standard errors holds with
// probability 99.7 % for a good generator; the seeds are fixed, so the tests are deterministic,
// and a broken generator (wrong scaling, correlated pairs, a bias) falls far outside.
const N = 20_000;

function moments(x: number[]): { mean: number; std: number } {
  const mean = x.reduce((a, b) => a + b, 0) / x.length;
  const v = x.reduce((a, b) => a + (b - mean) ** 2, 0) / (x.length - 1);
  return { mean, std: Math.sqrt(v) };
}

describe('createRandom', () => {
  it('gives the same stream for the same seed and another for another seed', () => {
    const a = createRandom(42);
    const b = createRandom(42);
    const c = createRandom(43);
    const xa = Array.from({ length: 8 }, () => a.nextUint32());
    expect(Array.from({ length: 8 }, () => b.nextUint32())).toEqual(xa);
    expect(Array.from({ length: 8 }, () => c.nextUint32())).not.toEqual(xa);
    expect(xa.every((x) => Number.isInteger(x) && x >= 0 && x < 2 ** 32)).toBe(true);
  });

  it('draws uniform numbers with mean 1/2 and standard deviation 1/sqrt(12)', () => {
    // Uniform on [0, 1): mean 1/2, variance 1/12 (closed form).
    const r = createRandom(7);
    const x = Array.from({ length: N }, () => r.uniform());
    expect(x.every((u) => u >= 0 && u < 1)).toBe(true);
    const s = Math.sqrt(1 / 12);
    const m = moments(x);
    expect(Math.abs(m.mean - 0.5)).toBeLessThan((3 * s) / Math.sqrt(N));
    // The variance of a uniform sample's standard deviation: 3 sigma band from its fourth moment
    // (kurtosis 9/5): se(s) = s sqrt((9/5 - 1)/(4n)).
    expect(Math.abs(m.std - s)).toBeLessThan(3 * s * Math.sqrt(0.8 / (4 * N)));
  });

  it('draws normal numbers (Box-Muller) with mean 0 and standard deviation 1', () => {
    const r = createRandom(11);
    const x = Array.from({ length: N }, () => r.normal());
    const m = moments(x);
    expect(Math.abs(m.mean)).toBeLessThan(3 / Math.sqrt(N));
    expect(Math.abs(m.std - 1)).toBeLessThan(3 / Math.sqrt(2 * (N - 1)));
    // Tails: P(|z| > 1.96) = 5 % (normal table). Binomial standard error sqrt(0.05 * 0.95 / n); 3 of them.
    const tail = x.filter((z) => Math.abs(z) > 1.959964).length / N;
    expect(Math.abs(tail - 0.05)).toBeLessThan(3 * Math.sqrt((0.05 * 0.95) / N));
  });
});

describe('streamSeed', () => {
  it('gives each parameter its own stream', () => {
    expect(streamSeed(1, 'a')).not.toBe(streamSeed(1, 'b'));
    expect(streamSeed(1, 'a')).toBe(streamSeed(1, 'a'));
    expect(streamSeed(1, 'a')).not.toBe(streamSeed(2, 'a'));
  });
});

describe('parameterValues', () => {
  it('draws a normal parameter with the given mean and standard deviation, the same on every call', () => {
    const p = { name: 'Rs', path: [], values: { kind: 'draw' as const, dist: 'normal' as const, a: 25, b: 2.5, count: N, unit: 'ohm' as const } };
    const x = parameterValues(p, 99) as number[];
    expect(parameterValues(p, 99)).toEqual(x);
    const m = moments(x);
    expect(Math.abs(m.mean - 25)).toBeLessThan((3 * 2.5) / Math.sqrt(N));
    expect(Math.abs(m.std - 2.5)).toBeLessThan((3 * 2.5) / Math.sqrt(2 * (N - 1)));
  });

  it('draws a log-normal parameter whose logarithm has mean ln(median) and the given sigma', () => {
    // ln x = ln(median) + sigma z, z standard normal: the same bands on ln x.
    const p = { name: 'RL', path: [], values: { kind: 'draw' as const, dist: 'log-normal' as const, a: 100, b: 0.2, count: N, unit: 'ohm' as const } };
    const m = moments((parameterValues(p, 5) as number[]).map(Math.log));
    expect(Math.abs(m.mean - Math.log(100))).toBeLessThan((3 * 0.2) / Math.sqrt(N));
    expect(Math.abs(m.std - 0.2)).toBeLessThan((3 * 0.2) / Math.sqrt(2 * (N - 1)));
  });

  it('draws a uniform parameter inside its bounds with mean (min + max)/2', () => {
    const p = { name: 'len', path: [], values: { kind: 'draw' as const, dist: 'uniform' as const, a: 190, b: 210, count: N, unit: 'm' as const } };
    const x = parameterValues(p, 3) as number[];
    expect(x.every((v) => v >= 190 && v < 210)).toBe(true);
    expect(Math.abs(moments(x).mean - 200)).toBeLessThan((3 * 20) / Math.sqrt(12 * N));
  });
});
