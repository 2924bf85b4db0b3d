// Inline plugins for the spectral tests, written against the public plugin API exactly as a user's
// plugin would be: loads with the `admittance` hook, waveforms with and without `laplace`.
import { defineLoad, defineProbe, defineSource, PluginRegistry, type NodeHandle, type TraceHandle } from '@skein/core';

/** Unit step at t = 0 (times amplitude); W(s) = A / s. */
export const stepSource = defineSource({
  type: 'step',
  summary: 'step at t = 0',
  params: { amplitude: { unit: '1', summary: 'height', default: 1 } },
  create: (p) => ({
    value: (t: number) => (t >= 0 ? p.amplitude : 0),
    laplace(sigma: number, omega: number, out: Float64Array) {
      const d = sigma * sigma + omega * omega;
      out[0] = (p.amplitude * sigma) / d;
      out[1] = (-p.amplitude * omega) / d;
    },
  }),
});

/** Rectangular pulse of height A from 0 to `width`; W(s) = A (1 - e^{-s width}) / s, exact at complex s. */
export const rectSource = defineSource({
  type: 'rect',
  summary: 'rectangular pulse at t = 0',
  params: { amplitude: { unit: '1', summary: 'height', default: 1 }, width: { unit: 's', summary: 'duration', min: 0, exclusiveMin: true } },
  create: (p) => ({
    value: (t: number) => (t >= 0 && t < p.width ? p.amplitude : 0),
    settledAfterS: p.width,
    laplace(sigma: number, omega: number, out: Float64Array) {
      // (1 - e^{-s w}) / s with s = sigma + j omega
      const e = Math.exp(-sigma * p.width);
      const nr = 1 - e * Math.cos(omega * p.width), ni = e * Math.sin(omega * p.width);
      const d = sigma * sigma + omega * omega;
      out[0] = (p.amplitude * (nr * sigma + ni * omega)) / d;
      out[1] = (p.amplitude * (ni * sigma - nr * omega)) / d;
    },
  }),
});

/** Raised-cosine edge from 0 to A over `rise`, no laplace hook (the spectral side samples value(t)). */
export const edgeSource = defineSource({
  type: 'edge',
  summary: 'raised-cosine edge',
  params: { amplitude: { unit: '1', summary: 'height', default: 1 }, rise: { unit: 's', summary: 'rise time', min: 0, exclusiveMin: true } },
  create: (p) => ({
    value: (t: number) => (t <= 0 ? 0 : t >= p.rise ? p.amplitude : (p.amplitude * (1 - Math.cos((Math.PI * t) / p.rise))) / 2),
    shortestFeatureS: p.rise,
    settledAfterS: p.rise,
  }),
});

/** Gaussian pulse exp(-((t - t0)/w)^2 / 2), no laplace hook. */
export const gaussianSource = defineSource({
  type: 'gaussian',
  summary: 'Gaussian pulse',
  params: { center: { unit: 's', summary: 't0' }, width: { unit: 's', summary: 'standard deviation' } },
  create: (p) => ({
    value: (t: number) => Math.exp(-0.5 * ((t - p.center) / p.width) ** 2),
    shortestFeatureS: p.width,
    settledAfterS: p.center + 8 * p.width,
  }),
});

export const resistorLoad = defineLoad({
  type: 'resistor',
  summary: 'resistor',
  params: { resistance: { unit: 'ohm', summary: 'R', min: 0, exclusiveMin: true } },
  create: (p) => ({
    kind: 'linear',
    conductanceS: 1 / p.resistance,
    admittance(_w: number, out: Float64Array) { out[0] = 1 / p.resistance; out[1] = 0; },
    admittanceAt(_sigma: number, _w: number, out: Float64Array) { out[0] = 1 / p.resistance; out[1] = 0; },
  }),
});

/** A resistor with only the j omega hook (no admittanceAt), for the numerical Laplace transform's error test. */
export const axisResistorLoad = defineLoad({
  type: 'axis-resistor',
  summary: 'resistor known only on the j omega axis',
  params: { resistance: { unit: 'ohm', summary: 'R', min: 0, exclusiveMin: true } },
  create: (p) => ({
    kind: 'linear',
    conductanceS: 1 / p.resistance,
    admittance(_w: number, out: Float64Array) { out[0] = 1 / p.resistance; out[1] = 0; },
  }),
});

export const capacitorLoad = defineLoad({
  type: 'capacitor',
  summary: 'capacitor, trapezoidal companion',
  params: { capacitance: { unit: 'F', summary: 'C', min: 0, exclusiveMin: true } },
  create: (p, ctx) => {
    const g = (2 * p.capacitance) / ctx.dtS;
    const s = new Float64Array(2);
    return {
      kind: 'linear',
      conductanceS: g,
      history: () => -(g * s[0] + s[1]),
      accept: (v: number, i: number) => { s[0] = v; s[1] = i; },
      admittance(w: number, out: Float64Array) { out[0] = 0; out[1] = w * p.capacitance; },
      admittanceAt(sigma: number, w: number, out: Float64Array) { out[0] = sigma * p.capacitance; out[1] = w * p.capacitance; },
    };
  },
});

/** A load without the frequency-domain hook, for the error test. */
export const bareLoad = defineLoad({
  type: 'bare-resistor',
  summary: 'resistor without admittance',
  params: { resistance: { unit: 'ohm', summary: 'R', min: 0, exclusiveMin: true } },
  create: (p) => ({ kind: 'linear', conductanceS: 1 / p.resistance }),
});

/** Node voltage probe for the time-domain runs. */
export const nodeProbe = defineProbe({
  type: 'node-voltage',
  summary: 'node voltage',
  params: { node: { kind: 'string', summary: 'junction.node' } },
  create: (p, ctx) => {
    const h: NodeHandle = ctx.node(p.node, 'node');
    const tr: TraceHandle = ctx.trace('v', 'V');
    return { sample: (s) => s.record(tr, s.nodeVoltage(h)) };
  },
});

/** The registry of the spectral tests. */
export function spectralRegistry(): PluginRegistry {
  const r = new PluginRegistry();
  for (const p of [stepSource, rectSource, edgeSource, gaussianSource, resistorLoad, axisResistorLoad, capacitorLoad, bareLoad, nodeProbe]) r.register(p, 'spectral/__tests__/fixtures.ts');
  return r;
}

/** A step behind 50 ohm into a matched 50 ohm line ending in 100 pF (REFERENCES.md, capacitive load after a matched source). */
export const CAPACITIVE_TERMINATION = `
skein: 1
time: { end: 40ns }
lines:
  tl: { from: S, to: L, length: 2m, impedance: 50ohm, velocity: 2e8m/s }
junctions:
  S:
    nodes: { s: [tl] }
    parts:
      gen: { source: step, between: [s, ref], amplitude: 1, resistance: 50ohm }
  L:
    nodes: { l: [tl] }
    parts:
      CL: { load: capacitor, between: [l, ref], capacitance: 100pF }
`;
