// Lossy lines through FDTD segments (leapfrog on the telegrapher's equations with R and G).
import { describe, expect, it } from 'vitest';
import { expectClose } from '../support/compare.ts';
import { runText } from '../support/run.ts';

// Complementary error function (W. H. Press et al., Numerical Recipes, 3rd ed., 6.2, Chebyshev
// fit with relative error below 1.2e-7).
function erfc(x: number): number {
  const z = Math.abs(x);
  const t = 1 / (1 + 0.5 * z);
  const r = t * Math.exp(-z * z - 1.26551223 + t * (1.00002368 + t * (0.37409196 + t * (0.09678418 + t * (-0.18628806 +
    t * (0.27886807 + t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))))));
  return x >= 0 ? r : 2 - r;
}

describe("Kelvin's RC cable", () => {
  it('diffuses a step as erfc(x sqrt(RC / 4t))', async () => {
    // W. Thomson, Proc. Roy. Soc. 7, 1855; Carslaw & Jaeger, Conduction of Heat in Solids, ch. II:
    // R = 10 ohm/km, C = 50 nF/km, x = 10 km: 0.15729921 at 12.5 us, 0.47950012 at 50 us,
    // 0.72367361 at 200 us (REFERENCES.md). The engine needs some L: 1 nH/m makes L/R = 0.1 us,
    // negligible against these times; 100 km stands in for semi-infinite (the diffusion time to its
    // end, RC x^2 = 5 ms, is far beyond the run). Tolerance 2e-3: cells of 50 m against a diffusion
    // length sqrt(t / RC) of 5 to 20 km, plus the small inductance.
    const r = await runText(`
skein: 1
time: { end: 202us, record: 10 }
lines:
  cable: { from: shore, to: far, length: 100km, inductance: 1nH/m, capacitance: 50pF/m, resistance: 10ohm/km, fdtd: { cells: 2000 } }
junctions:
  shore:
    nodes: { s: [cable] }
    parts: { key: { source: step, between: [s, ref], amplitude: 1 } }
  far:
    nodes: { f: [cable] }
    parts: { R: { load: resistor, between: [f, ref], resistance: 1kohm } }
probes:
  x10: { probe: line-point, line: cable, position: 10km }
`, 'kelvin.yaml');
    const RC = 1e-2 * 5e-11;
    for (const [t, ref] of [[12.5e-6, 0.15729921], [50e-6, 0.47950012], [200e-6, 0.72367361]] as const) {
      expectClose(`closed form at ${t * 1e6} us`, erfc(1e4 * Math.sqrt(RC / (4 * t))), ref, { rel: 2e-6 });
      expectClose(`v(10 km) at ${t * 1e6} us`, r.at('x10.v.w', t), ref, { rel: 0, abs: 2e-3 });
    }
  });
});

describe("Heaviside's distortionless line", () => {
  it('delivers a Gaussian pulse undistorted, attenuated by exp(-alpha l)', async () => {
    // R/L = G/C: L = 250 nH/m, C = 100 pF/m, R = 0.05 ohm/m, G = 2e-5 S/m: Z0 = 50 ohm, v = 2e8 m/s,
    // alpha = sqrt(RG) = 1e-3 Np/m at every frequency (O. Heaviside, Electromagnetic Theory, 1893;
    // REFERENCES.md). After 1 km: 5 us later, peak e^-1 = 0.36787944 of the incident. With one cell
    // per step at the line's speed the leapfrog carries the wave without dispersion; the losses'
    // time averaging leaves an error of order (alpha dz)^2 / 12 per cell, 1e-3 of the peak in all.
    const r = await runText(`
skein: 1
time: { end: 8us }
lines:
  line: { from: A, to: B, length: 1km, inductance: 250nH/m, capacitance: 100pF/m, resistance: 0.05ohm/m, conductance: 2e-5S/m, fdtd: { cells: 1000 } }
junctions:
  A:
    nodes: { a: [line] }
    parts: { gen: { source: gaussian, between: [a, ref], amplitude: 2, centre: 0.5us, width: 50ns, resistance: 50ohm } }
  B:
    nodes: { b: [line] }
    parts: { R: { load: resistor, between: [b, ref], resistance: 50ohm } }
probes:
  near: { probe: node-voltage, node: A.a }
  far: { probe: node-voltage, node: B.b }
  ledger: { probe: energy-ledger }
`, 'heaviside.yaml');
    expect(r.dtS).toBeCloseTo(5e-9, 15);
    const near = r.series('near.v');
    const far = r.series('far.v');
    const shift = Math.round(5e-6 / r.dtS);
    const peak = Math.max(...near);
    expectClose('incident peak', peak, 1, { rel: 1e-3 });
    for (let i = shift; i < far.length; i += 7) {
      expectClose(`far end at sample ${i}`, far[i], Math.exp(-1) * near[i - shift], { rel: 0, abs: 1e-3 * peak });
    }
    const farPeak = Math.max(...far);
    expectClose('far-end peak', farPeak, 0.36787944, { rel: 2e-3 });
    // The ledger closes with the line's losses to the scheme's order.
    const l = r.ledger!;
    expect(l.lostJ).toBeGreaterThan(0.5 * l.deliveredJ * 0.5);
    expect(Math.abs(l.residualJ) / l.deliveredJ).toBeLessThan(1e-3);
  });
});

describe('finite RC line', () => {
  it('charges its open far end as the separation-of-variables series says', async () => {
    // A step of 1 V on an RC line of length l whose far end is open (dv/dx = 0 there):
    // v(x, t) = 1 - sum_k 4 / ((2k+1) pi) sin((2k+1) pi x / 2l) exp(-((2k+1) pi / 2l)^2 t / RC),
    // derived by separation of variables (the method of H. S. Carslaw and J. C. Jaeger,
    // Conduction of Heat in Solids, 2nd ed., 1959, ch. III, from memory). Same line as Kelvin's
    // case, 10 km long; tolerance 2e-3 for the same reasons.
    const R = 1e-2;
    const C = 5e-11;
    const l = 1e4;
    const r = await runText(`
skein: 1
time: { end: 152us, record: 10 }
lines:
  cable: { from: shore, to: far, length: 10km, inductance: 1nH/m, capacitance: 50pF/m, resistance: 10ohm/km, fdtd: { cells: 400 } }
junctions:
  shore:
    nodes: { s: [cable] }
    parts: { key: { source: step, between: [s, ref], amplitude: 1 } }
  far:
    nodes: { f: [cable] }
probes:
  end: { probe: node-voltage, node: far.f }
`, 'finiteRc.yaml');
    const series = (x: number, t: number): number => {
      let v = 1;
      for (let k = 0; k < 200; k++) {
        const m = ((2 * k + 1) * Math.PI) / (2 * l);
        v -= (4 / ((2 * k + 1) * Math.PI)) * Math.sin(m * x) * Math.exp((-m * m * t) / (R * C));
      }
      return v;
    };
    for (const t of [20e-6, 50e-6, 100e-6, 150e-6]) {
      expectClose(`open end at ${t * 1e6} us`, r.at('end.v', t), series(l, t), { rel: 0, abs: 2e-3 });
    }
  });
});
