/**
 * Benchmark: per-step cost of a frequency-dependent multiconductor line in a network
 * (packages/core/src/line/fdModal.ts: constant modal transformation, each mode fitted and stepped
 * by recursive convolution, phase-domain Norton ends) for a 1 km and a 100 km line of the same
 * cross-section, same time step and number of steps, in the same run. The work per step is the
 * modes' poles and one ring read and write per mode and end, plus the n x n transformations at the
 * ends, so the ratio should be 1 (the issue asks within 1.2); only the rings' memory grows.
 *
 * Each run compiles its scenario (the fits, outside the timer) and then times the line's own
 * phases (run/fdPhase.ts: before and after the junctions) for every step, with the end voltages
 * driven as the junctions would set them: the near end of wire a follows a 20 ns ramp behind
 * 50 ohm, the other ends see 100 ohm, solved from the line's Norton equivalent i = G v + Ti h by
 * one n x n solve prepared before the loop. The junction solve of a network run is the same for
 * both lengths and is left out, as in fdLineBench.ts. After one warm-up run of each, the runs
 * alternate 1 km / 100 km `reps` times in ABBA order and the minimum of each is kept (least
 * disturbed by other load on the machine); the far-end crosstalk is summed into a checksum so the
 * work cannot be skipped.
 *
 * Usage: npx tsx benchmarks/fdline/fdMultiBench.ts [--steps 200000] [--reps 6] [--conductors 2|3] [--quick]
 */
import { Matrix, inverse } from 'ml-matrix';
import { compileScenario, loadPluginModules, PluginRegistry, resolveScenarioText } from '../../packages/core/src/index.ts';
import { phaseFdAfter, phaseFdBefore } from '../../packages/core/src/run/fdPhase.ts';
import { STANDARD_PLUGINS, STANDARD_PLUGINS_BASE } from '../../packages/cli/src/index.ts';

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? Number(process.argv[i + 1]) : fallback;
}

const quick = process.argv.includes('--quick');
const steps = arg('steps', quick ? 20_000 : 200_000);
const reps = arg('reps', quick ? 2 : 6);
const nCond = arg('conductors', 2);
const dtS = 1e-9;

// Invented cross-sections: a symmetric pair of bare copper wires 2 cm over perfect ground (skin
// effect), or three unequal wires over earth of 1000 ohm*m (Carson).
const SECTION = nCond === 3
  ? `{ kind: wires, ground: { resistivityOhmM: 1000 }, wires: [{ name: a, x: -3m, y: 9m, radius: 12mm, material: aluminium }, { name: b, x: 2.5m, y: 12m, radius: 8mm, material: aluminium }, { name: c, x: 0m, y: 18m, radius: 4mm, material: copper }] }`
  : `{ kind: wires, ground: perfect, wires: [{ name: a, x: -1cm, y: 2cm, radius: 0.4064mm }, { name: b, x: 1cm, y: 2cm, radius: 0.4064mm }] }`;
const names = nCond === 3 ? ['a', 'b', 'c'] : ['a', 'b'];

const scenario = (lengthM: number): string => `
skein: 1
time: { end: ${steps * dtS}s, step: ${dtS}s }
lines:
  line: { from: near, to: far, length: ${lengthM}m, section: ${SECTION}, model: frequency-dependent }
junctions:
  near:
    nodes: { ${names.map((c) => `${c}: [line.${c}]`).join(', ')} }
    parts:
      gen: { source: trapezoid, between: [a, ref], amplitude: 1, delay: 5ns, rise: 20ns, width: 1s, fall: 20ns, resistance: 50ohm }
${names.slice(1).map((c) => `      Rn${c}: { load: resistor, between: [${c}, ref], resistance: 100ohm }`).join('\n')}
  far:
    nodes: { ${names.map((c) => `${c}: [line.${c}]`).join(', ')} }
    parts:
${names.map((c) => `      Rf${c}: { load: resistor, between: [${c}, ref], resistance: 100ohm }`).join('\n')}
probes:
  fb: { probe: node-voltage, node: far.b }
`;

const registry = await loadPluginModules(new PluginRegistry(), STANDARD_PLUGINS, STANDARD_PLUGINS_BASE);
const lengths = [1_000, 100_000];
const texts = lengths.map(scenario);

async function once(k: number): Promise<{ stepMs: number; checksum: number; last: number; fitMs: number; taus: number[]; poles: number[]; coupling: number }> {
  const sc = resolveScenarioText(texts[k], { registry, file: `fd${lengths[k]}.yaml` });
  const t0 = performance.now();
  const plan = await compileScenario(sc, { registry });
  const fitMs = performance.now() - t0;
  const fd = plan.fdLines[0];
  const n = fd.n;
  // Terminal solve per end: (G + Gt) v = Is - Ti h, Gt = diag of the terminations, prepared here.
  const solves = [0, 1].map((e) => {
    const m = new Matrix(n, n);
    for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) m.set(a, b, fd.G[a * n + b] + (a === b ? (e === 0 && a === 0 ? 1 / 50 : 1 / 100) : 0));
    return Float64Array.from(inverse(m).to1DArray());
  });
  const rhs = new Float64Array(n);
  const slot = plan.slot;
  const x = plan.x;
  let s = 0;
  let last = 0;
  const t1 = performance.now();
  for (let k = 0; k <= steps; k++) {
    phaseFdBefore(plan, k);
    for (let e = 0; e < 2; e++) {
      for (let a = 0; a < n; a++) rhs[a] = -slot[fd.slotBase + e * n + a];
      if (e === 0) rhs[0] += Math.min(1, (k * dtS) / 20e-9) / 50;
      const K = solves[e];
      for (let a = 0; a < n; a++) {
        let v = 0;
        for (let b = 0; b < n; b++) v += K[a * n + b] * rhs[b];
        x[fd.xEnd[e * n + a]] = v;
      }
    }
    phaseFdAfter(plan, k);
    last = x[fd.xEnd[n + 1]];
    s += last;
  }
  const stepMs = performance.now() - t1;
  return {
    stepMs, checksum: s, last, fitMs,
    taus: fd.model.modes.map((m) => m.tauS),
    poles: fd.model.modes.map((m) => m.yc.polesRe.length + m.h.polesRe.length),
    coupling: fd.runCoupling?.max ?? 0,
  };
}

const best = [Infinity, Infinity];
const all: number[][] = [[], []];
const info: Array<Awaited<ReturnType<typeof once>>> = [];
for (let k = 0; k < lengths.length; k++) info[k] = await once(k); // warm-up (JIT)
for (let r = 0; r < reps; r++) {
  for (let q = 0; q < lengths.length; q++) {
    const k = r % 2 === 0 ? q : lengths.length - 1 - q;
    const res = await once(k);
    best[k] = Math.min(best[k], res.stepMs);
    all[k].push(res.stepMs);
    info[k] = res;
  }
}
const perStepNs = best.map((ms) => (ms * 1e6) / (steps + 1));
const ratio = perStepNs[1] / perStepNs[0];
const report = {
  conductors: nCond, stepsPerRun: steps + 1, reps, dtS,
  cases: lengths.map((L, k) => ({
    lengthKm: L / 1000,
    fittedDelaysUs: info[k].taus.map((t) => t * 1e6),
    ringSamplesPerModeEnd: info[k].taus.map((t) => Math.ceil(t / dtS) + 1),
    polesPerMode: info[k].poles,
    neglectedCoupling: info[k].coupling,
    compileMs: info[k].fitMs,
    bestStepLoopMs: best[k],
    medianStepLoopMs: [...all[k]].sort((a, b) => a - b)[Math.floor(all[k].length / 2)],
    nsPerStep: perStepNs[k],
    farEndChecksum: info[k].checksum,
    farEndAtEndV: info[k].last,
  })),
  ratio100kmTo1km: ratio,
  withinTarget: ratio <= 1.2 && ratio >= 1 / 1.2,
};
console.log(JSON.stringify(report, null, 2));
console.error(`per step (${nCond} conductors, line phases): 1 km ${perStepNs[0].toFixed(0)} ns, 100 km ${perStepNs[1].toFixed(0)} ns, ratio ${ratio.toFixed(3)} (target within 1.2)`);
if (!report.withinTarget) process.exitCode = 1;
