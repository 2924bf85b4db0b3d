// The example scenarios in packages/cli/examples and the built-in demo, each run and checked.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { EigenvalueDecomposition, Matrix, inverse } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { DEMO_SCENARIO } from '@skein/cli';
import { expectClose } from '../support/compare.ts';
import { runText } from '../support/run.ts';

const example = (name: string): string => readFileSync(fileURLToPath(new URL(`../../packages/cli/examples/${name}`, import.meta.url)), 'utf8');

describe('examples', () => {
  it('runs the demo harness with the ledger closed and waves where they belong', async () => {
    const r = await runText(readFileSync(DEMO_SCENARIO, 'utf8'), 'harness.yaml');
    expect(r.ledger).toBeDefined();
    const l = r.ledger!;
    expect(l.deliveredJ).toBeGreaterThan(0);
    // Fractional delays are interpolated here, which is slightly lossy: the residual is what the
    // interpolation dissipated; it must stay a small fraction of the delivered energy.
    expect(Math.abs(l.residualJ) / l.deliveredJ).toBeLessThan(0.02);
    // The receiver sees nothing before the pulse (2 ns + 4 m / c + 1.5 m / 0.8c = 21.6 ns) arrives.
    expect(Math.abs(r.at('vReceiver.v', 20e-9))).toBeLessThan(1e-9);
    expect(Math.abs(r.peaks.find((p) => p.trace === 'vReceiver.v')!.max)).toBeGreaterThan(0.5);
    // Near-end crosstalk on the spare wire has the sign of the driven edge (common practice).
    expect(r.at('crosstalkNear.v', 4e-9)).toBeGreaterThan(0);
  });

  it('shows the load of a long loop responding long before the round trip', async () => {
    const text = example('loopSideBySide.yaml');
    const r = await runText(text, 'loopSideBySide.yaml');
    const dt = r.dtS;
    const vLamp = r.series('vLamp.v');
    // Until the round trip (2 x 300 m at c = 2.0 us) the near end sees the line as infinitely long:
    // V = Zc I with the terminations, a linear system solved here from the same matrices with
    // ml-matrix (the line equations of C. R. Paul, MTL, 2nd ed., ch. 7, from memory).
    const Lm = yamlMatrix(text, 'inductance', 1e-6);
    const Cm = yamlMatrix(text, 'capacitance', 1e-12);
    // Homogeneous medium check (L C = I / c^2 to the 7 digits given), then
    // Zc = C^-1/2 (C^1/2 L C^1/2)^1/2 C^-1/2 by symmetric square roots (a form independent of the
    // engine's Cholesky-based decomposition).
    const c = 299792458;
    const LC = new Matrix(Lm).mmul(new Matrix(Cm));
    for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) expect(Math.abs(LC.get(i, j) * c * c - (i === j ? 1 : 0))).toBeLessThan(1e-6);
    const S = sqrtm(new Matrix(Cm));
    const Si = inverse(S);
    const Zc = Si.mmul(sqrtm(S.mmul(new Matrix(Lm)).mmul(S))).mmul(Si);
    // Terminations: source 12 V with 1 ohm between a and b, 100 ohm between c and d (conductor
    // currents I into the line): I_a = -I_b = (12 - (Va - Vb)) / 1, I_c = -I_d = -(Vc - Vd) / 100.
    const G = new Matrix([[1, -1, 0, 0], [-1, 1, 0, 0], [0, 0, 0.01, -0.01], [0, 0, -0.01, 0.01]]);
    const J = Matrix.columnVector([12, -12, 0, 0]);
    const A = Matrix.eye(4).add(Zc.mmul(G));
    const V = inverse(A).mmul(Zc).mmul(J);
    const expectedLamp = V.get(2, 0) - V.get(3, 0);
    expectClose('lamp voltage on the first plateau', vLamp[Math.round(1e-6 / dt)], expectedLamp, { rel: 1e-6 });
    // It is there from the first step (the 0.5 m gap takes 1.7 ns, less than one 5 ns step) ...
    expectClose('lamp voltage at the first step', vLamp[1], expectedLamp, { rel: 1e-6 });
    expect(Math.abs(expectedLamp)).toBeGreaterThan(0.01);
    // ... but the full current only arrives after the round trip.
    const before = Math.abs(vLamp[Math.round(1.9e-6 / dt)]);
    const after = Math.abs(vLamp[Math.round(2.1e-6 / dt)]);
    expect(after).toBeGreaterThan(5 * before);
  });

  it('keeps DC power flowing one way, equal at every cross-section once settled', async () => {
    const r = await runText(example('powerDc.yaml'), 'powerDc.yaml');
    // Settled: V = 230 * 100 / 102 at the heater; P = V^2 / 100 (Ohm's law, lossless line).
    const pLoad = (230 * 100 / 102) ** 2 / 100;
    for (const name of ['p0.p', 'p250.p', 'p500.p', 'p1000.p']) {
      const p = r.series(name);
      expectClose(`${name} settled`, p[p.length - 1], pLoad, { rel: 1e-3 });
      expect(Math.min(...p)).toBeGreaterThanOrEqual(-1e-9 * pLoad);
    }
    const iL = r.series('iLive.i.live');
    const iN = r.series('iNeutral.i.neutral');
    expectClose('return current', iN[iN.length - 1], -iL[iL.length - 1], { rel: 1e-6 });
  });

  it('keeps AC power flowing one way while the current alternates', async () => {
    const r = await runText(example('powerAc.yaml'), 'powerAc.yaml');
    const dt = r.dtS * r.recordEvery;
    const last = Math.round(0.04 / dt);
    const iL = r.series('iLive.i.live').subarray(last);
    expect(Math.max(...iL)).toBeGreaterThan(2);
    expect(Math.min(...iL)).toBeLessThan(-2);
    for (const name of ['p0.p', 'p250.p', 'p500.p', 'p1000.p']) {
      const p = r.series(name).subarray(last);
      const pMax = Math.max(...p);
      // v*i alternates at twice the mains frequency but keeps its sign. The line's own
      // capacitance and inductance shift current against voltage by about omega*(C_line*R +
      // L_line/R) ~ 1e-4 rad at 50 Hz, which allows a negative excursion near the zero crossings of
      // that relative size; 1e-3 of the peak bounds it with margin.
      expect(Math.min(...p)).toBeGreaterThan(-1e-3 * pMax);
      expectClose(`${name} peak`, pMax, (325 * 100 / 102) ** 2 / 100, { rel: 0.01 });
    }
  });
});

function yamlMatrix(text: string, key: string, scale: number): number[][] {
  const start = text.indexOf(`${key}:`);
  const rows: number[][] = [];
  for (const line of text.slice(start).split('\n').slice(1, 5)) {
    rows.push([...line.matchAll(/(-?[0-9.]+)[pu]/g)].map((m) => Number(m[1]) * scale));
  }
  return rows;
}

function sqrtm(m: Matrix): Matrix {
  const e = new EigenvalueDecomposition(m.add(m.transpose()).mul(0.5), { assumeSymmetric: true });
  const V = e.eigenvectorMatrix;
  return V.mmul(Matrix.diag(e.realEigenvalues.map(Math.sqrt))).mmul(V.transpose());
}

describe('service entrance example', () => {
  it('splits the surge energy between the stages with the ledger closed', async () => {
    const r = await runText(example('serviceEntrance.yaml'), 'serviceEntrance.yaml');
    const l = r.ledger!;
    // Newton converges each step to 1e-9 (1 + |v|) V; the ledger closes to that order.
    expect(Math.abs(l.residualJ) / l.deliveredJ).toBeLessThan(1e-5);
    const led = r.outputs.ledger as { absorbed: Record<string, number> };
    const arrester = r.outputs['part:arrester'] as { energyJ: number; peakCurrentA: number };
    const protector = r.outputs['part:protector'] as { energyJ: number };
    // The device's own energy meter and the engine's ledger integrate the same v*i with two
    // quadratures (trapezoid of the product vs step-centred product): they agree to O(dt^2),
    // here to 1e-4 relative.
    expectClose('arrester energy, device vs ledger', arrester.energyJ, led.absorbed.arrester, { rel: 1e-4 });
    expectClose('protector energy, device vs ledger', protector.energyJ, led.absorbed.protector, { rel: 1e-3 });
    // The appliance protector clamps lower than the entrance arrester, so at 20 m it takes about
    // half of the energy and more than its 40 J rating: the run says so.
    expect(protector.energyJ).toBeGreaterThan(40);
    expect(arrester.peakCurrentA).toBeGreaterThan(100);
    expect(r.warnings.some((w) => w.startsWith('protector: rating exceeded:'))).toBe(true);
  });
});

describe('overhead span example (frequency-dependent multiconductor line)', () => {
  it('keeps the far end at rest until the fastest wave can arrive, and closes the ledger', async () => {
    const r = await runText(example('overheadSpanFd.yaml'), 'overheadSpanFd.yaml');
    // Time of flight: no mode of wires in air over earth travels faster than light (common
    // practice), so nothing reaches the east end 3 km away before 3 km / c = 10.007 us.
    const tArrive = 3000 / 299792458;
    const t = r.times();
    for (const trace of ['eastA.v', 'eastB.v', 'eastC.v']) {
      const v = r.series(trace);
      for (let i = 0; i < t.length && t[i] < tArrive - 0.1e-6; i++) expect(Math.abs(v[i]), `${trace} at ${t[i]} s`).toBeLessThan(1e-12);
    }
    // The surge does arrive, on the struck wire and, induced, on the others.
    expect(r.peaks.find((p) => p.trace === 'eastA.v')!.max).toBeGreaterThan(1);
    expect(Math.abs(r.at('eastB.v', 14e-6))).toBeGreaterThan(0.05);
    // The ledger closes to rounding (resistive terminations, the line's intake counted as lost).
    const l = r.ledger!;
    expect(Math.abs(l.residualJ) / l.deliveredJ).toBeLessThan(1e-9);
    expect(l.lostJ).toBeGreaterThan(0);
  }, 120_000);
});

describe('repaired cable example', () => {
  it('shows the 75 ohm repair piece as a reflection of 0.2 and its far joint of -0.2, at the times of flight', async () => {
    // Bewley lattice / common transmission-line theory (L. V. Bewley, Trans. AIEE 50, 1931, from
    // memory): the incident 0.5 V (matched 50 ohm generator) meets 50 -> 75 ohm at 40 m: reflection
    // (75 - 50) / 125 = 0.2, so the near end goes to 0.6 V once it returns, 2 x 40 m / 0.66c =
    // 404.3 ns after the edge (centred at 7.5 ns); the 1.2 x 0.5 V inside the piece meets 75 -> 50
    // ohm: reflection -0.2, back through the first joint (x 2 x 50 / 125 = 0.8) to the near end
    // 2 x 1.5 m / 0.66c = 15.2 ns later: 0.6 - 0.096 = 0.504 V (the next echo, 0.2 x 0.2 smaller
    // again, comes 15.2 ns after that). At the far end: 0.5 x 1.2 x 0.8 = 0.48 V. The cells'
    // delay is the automatic step, where the scheme carries each stretch without dispersion; the
    // plateaus are read 2 ns after the edge has passed. Tolerance 1e-3 V: the edge (5 ns, smooth)
    // spans the piece's 7.6 ns, which the plateaus are clear of.
    const r = await runText(example('repairedCable.yaml'), 'repairedCable.yaml');
    const v = 0.66 * 299792458;
    const back = (2 * 40) / v;
    const piece = (2 * 1.5) / v;
    expectClose('near end before the echo', r.at('near.v', 7.5e-9 + back - 5e-9), 0.5, { rel: 0, abs: 1e-3 });
    expectClose('near end on the first echo', r.at('near.v', 7.5e-9 + back + 4.5e-9), 0.6, { rel: 0, abs: 1e-3 });
    expectClose('near end after the second joint', r.at('near.v', 7.5e-9 + back + piece + 4.5e-9), 0.504, { rel: 0, abs: 1e-3 });
    expectClose('far end', r.at('far.v', 7.5e-9 + 61.5 / v + 5e-9), 0.48, { rel: 0, abs: 1e-3 });
    expect(Math.abs(r.at('far.v', 61.5 / v - 1e-9))).toBeLessThan(1e-9);
    const l = r.ledger!;
    expect(Math.abs(l.residualJ) / l.deliveredJ).toBeLessThan(1e-6);
  });
});
