import { resolveScenarioText } from '@skein/core';
import { computeSection } from '../../packages/lines/src/index.ts';
import { timeResponse } from '@skein/spectral';
import { standardRegistry } from '../support/run.ts';
import { simulateFdLine } from '../../packages/core/src/line/fdLine.ts';
const diel = process.argv[2] === 'const' ? '{ relPermittivity: 2.25, lossTangent: 2e-4 }' : '{ relPermittivity: 2.25, lossTangent: 2e-4, model: djordjevic-sarkar }';
const LEN = 50;
const NET = `skein: 1
time: { end: 2us }
lines:
  cable:
    from: A
    to: B
    length: ${LEN}m
    section: { kind: coax, innerRadius: 0.405mm, shieldInnerRadius: 1.475mm, dielectric: ${diel} }
junctions:
  A:
    nodes: { a: [cable] }
    parts: { gen: { source: trapezoid, between: [a, ref], amplitude: 1, delay: 2ns, rise: 4ns, width: 20ns, fall: 4ns, resistance: 10ohm } }
  B:
    nodes: { b: [cable] }
    parts: { R: { load: resistor, between: [b, ref], resistance: 200ohm } }
`;
const registry = await standardRegistry();
const sc = resolveScenarioText(NET, { registry, file: 'fd.yaml' });
const dt = 0.05e-9; const steps = 40000;
const trap = (t: number) => { const t0 = 2e-9, t1 = 6e-9, t2 = 26e-9, t3 = 30e-9; if (t <= t0 || t >= t3) return 0; if (t < t1) return (t - t0) / 4e-9; if (t <= t2) return 1; return (t3 - t) / 4e-9; };
const section = computeSection(process.argv[2] === 'const' ? { kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric: { relPermittivity: 2.25, lossTangent: 2e-4 } } : { kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric: { relPermittivity: 2.25, lossTangent: 2e-4, model: 'djordjevic-sarkar' } });
let t0 = performance.now();
const r = simulateFdLine({ section, lengthM: LEN, dtS: dt, steps, source: { v: trap, resistanceOhm: 10 }, loadR: 200, fit: { fMinHz: 1e3, fMaxHz: Number(process.argv[3] ?? 1e9) } });
console.log('sim ms', performance.now() - t0, 'step ms', r.stepMs, r.model.errors, r.model.tauS, r.model.losslessDelayS, r.model.yc.polesRe.length, r.model.h.polesRe.length);
const every = 20;
const times = Array.from({ length: steps / every }, (_, i) => i * every * dt);
t0 = performance.now();
const ref = await timeResponse(sc, registry, { outputs: [{ kind: 'voltage', node: 'A.a' }, { kind: 'voltage', node: 'B.b' }], timesS: times });
console.log('spectral ms', performance.now() - t0, ref.method);
for (const [k, arr] of [[0, r.vNear], [1, r.vFar]] as const) {
  const fd = ref.series[k].values;
  let peak = 0, worst = 0, at = 0;
  for (let i = 0; i < fd.length; i++) { peak = Math.max(peak, Math.abs(fd[i])); const d = Math.abs(arr[i * every] - fd[i]); if (d > worst) { worst = d; at = times[i]; } }
  console.log(k, 'peak', peak, 'worst', worst, worst / peak, 'at', at);
}
