// Small compiled networks for the blocked-kernel tests: core's own compile step on scenario text,
// with the rings re-laid out large enough for nB steps per visit (nextPow2(k + nB + 1) slots).
import { compileScenario, resolveScenarioText, widenRings, type Plan } from '../../index.ts';
import { testRegistry } from '../../__tests__/fixtures.ts';

/**
 * One-conductor star-and-chain network: delays 6..12 steps (some fractional), resistors, a step
 * source that switches on at t = 3 dt (so the slot value changes inside a block), an open end.
 */
export const scalarScenario = `
skein: 1
time: { end: 400ns, step: 1ns }
lines:
  a: { from: S, to: H, length: 1.3m, impedance: 50ohm, velocity: 2e8m/s }
  b: { from: H, to: P, length: 1.7m, impedance: 75ohm, velocity: 2e8m/s }
  c: { from: H, to: Q, length: 2.05m, impedance: 120ohm, velocity: 2e8m/s }
  d: { from: Q, to: O, length: 2.4m, impedance: 90ohm, velocity: 2e8m/s }
junctions:
  S:
    nodes: { s: [a] }
    parts:
      g: { source: test-step, between: [s, ref], amplitude: 1, delay: 3ns, resistance: 20ohm }
  H: { nodes: { h: [a, b, c] } }
  P:
    nodes: { p: [b] }
    parts:
      rp: { load: test-resistor, between: [p, ref], resistance: 33ohm }
  Q:
    nodes: { q: [c, d] }
    parts:
      rq: { load: test-resistor, between: [q, ref], resistance: 470ohm }
  O: { nodes: { o: [d] } }
`;

/** Two-conductor lines (two modes with different speeds), so the general kernel runs. */
export const coupledScenario = `
skein: 1
time: { end: 400ns, step: 1ns }
lines:
  a: { from: S, to: H, length: 1.5m, conductors: [x, y], inductance: [[400nH/m, 80nH/m], [80nH/m, 380nH/m]], capacitance: [[90pF/m, -15pF/m], [-15pF/m, 85pF/m]] }
  b: { from: H, to: P, length: 1.9m, conductors: [x, y], inductance: [[420nH/m, 60nH/m], [60nH/m, 400nH/m]], capacitance: [[80pF/m, -10pF/m], [-10pF/m, 82pF/m]] }
  c: { from: H, to: Q, length: 2.3m, conductors: [x, y], inductance: [[400nH/m, 80nH/m], [80nH/m, 380nH/m]], capacitance: [[90pF/m, -15pF/m], [-15pF/m, 85pF/m]] }
junctions:
  S:
    nodes: { sx: [a.x], sy: [a.y] }
    parts:
      g: { source: test-step, between: [sx, ref], amplitude: 1, delay: 4ns, resistance: 25ohm }
      ry: { load: test-resistor, between: [sy, ref], resistance: 100ohm }
  H: { nodes: { hx: [a.x, b.x, c.x], hy: [a.y, b.y, c.y] } }
  P:
    nodes: { px: [b.x], py: [b.y] }
    parts:
      rx: { load: test-resistor, between: [px, ref], resistance: 60ohm }
      rpy: { load: test-resistor, between: [py, ref], resistance: 150ohm }
  Q:
    nodes: { qx: [c.x], qy: [c.y] }
    parts:
      rqx: { load: test-resistor, between: [qx, qy], resistance: 200ohm }
      rqy: { load: test-resistor, between: [qy, ref], resistance: 47ohm }
`;

/** A compiled plan whose rings hold nextPow2(k + maxBlock + 1) slots, plus its shortest delay. */
export interface BlockedPlan {
  plan: Plan;
  kMin: number;
}

/** Compiles scenario text and widens every ring for blocks of up to maxBlock steps. */
export async function compileWide(text: string, maxBlock: number): Promise<BlockedPlan> {
  const registry = testRegistry();
  const plan = await compileScenario(resolveScenarioText(text, { registry, file: 'blocked.yaml' }), { registry });
  // nB steps per visit need nB - 1 more steps of history than one step does (rings.ts).
  widenRings(plan, new Int32Array(plan.scenario.lines.length).fill(maxBlock - 1));
  const kMin = Math.min(...plan.delays.map((d) => d.k));
  return { plan, kMin };
}

const L4 = '[[400nH/m, 80nH/m, 40nH/m, 20nH/m], [80nH/m, 390nH/m, 70nH/m, 35nH/m], [40nH/m, 70nH/m, 410nH/m, 60nH/m], [20nH/m, 35nH/m, 60nH/m, 380nH/m]]';
const C4 = '[[90pF/m, -15pF/m, -5pF/m, -2pF/m], [-15pF/m, 95pF/m, -12pF/m, -4pF/m], [-5pF/m, -12pF/m, 88pF/m, -10pF/m], [-2pF/m, -4pF/m, -10pF/m, 92pF/m]]';

/** Four-conductor lines: every junction has four nodes and no constraint row (the four-node fast path). */
export const fourScenario = `
skein: 1
time: { end: 400ns, step: 1ns }
lines:
  a: { from: S, to: H, length: 1.5m, conductors: [p, q, r, s], inductance: ${L4}, capacitance: ${C4} }
  b: { from: H, to: P, length: 1.9m, conductors: [p, q, r, s], inductance: ${L4}, capacitance: ${C4} }
  c: { from: H, to: Q, length: 2.3m, conductors: [p, q, r, s], inductance: ${L4}, capacitance: ${C4} }
junctions:
  S:
    nodes: { sp: [a.p], sq: [a.q], sr: [a.r], ss: [a.s] }
    parts:
      g: { source: test-step, between: [sp, ref], amplitude: 1, delay: 4ns, resistance: 25ohm }
      g2: { source: test-step, between: [sr, ss], amplitude: 1, delay: 4ns, resistance: 40ohm }
      rq: { load: test-resistor, between: [sq, ref], resistance: 100ohm }
  H: { nodes: { hp: [a.p, b.p, c.p], hq: [a.q, b.q, c.q], hr: [a.r, b.r, c.r], hs: [a.s, b.s, c.s] } }
  P:
    nodes: { pp: [b.p], pq: [b.q], pr: [b.r], ps: [b.s] }
    parts:
      r1: { load: test-resistor, between: [pp, ref], resistance: 60ohm }
      r2: { load: test-resistor, between: [pq, pr], resistance: 150ohm }
  Q:
    nodes: { qp: [c.p], qq: [c.q], qr: [c.r], qs: [c.s] }
    parts:
      r3: { load: test-resistor, between: [qs, ref], resistance: 47ohm }
`;

/** One-conductor hubs of four and five line ends (and leaves of one), delays 6..11 steps. */
export const hubScenario = `
skein: 1
time: { end: 400ns, step: 1ns }
lines:
  a: { from: S, to: H4, length: 1.3m, impedance: 50ohm, velocity: 2e8m/s }
  b: { from: H4, to: L1, length: 1.7m, impedance: 75ohm, velocity: 2e8m/s }
  c: { from: H4, to: L2, length: 2.05m, impedance: 120ohm, velocity: 2e8m/s }
  d: { from: H4, to: H5, length: 1.2m, impedance: 90ohm, velocity: 2e8m/s }
  e: { from: H5, to: L3, length: 1.9m, impedance: 60ohm, velocity: 2e8m/s }
  f: { from: H5, to: L4, length: 2.2m, impedance: 150ohm, velocity: 2e8m/s }
  g: { from: H5, to: L5, length: 1.45m, impedance: 40ohm, velocity: 2e8m/s }
  h: { from: H5, to: L6, length: 1.6m, impedance: 100ohm, velocity: 2e8m/s }
junctions:
  S:
    nodes: { s: [a] }
    parts:
      g1: { source: test-step, between: [s, ref], amplitude: 1, delay: 3ns, resistance: 20ohm }
  H4: { nodes: { h: [a, b, c, d] } }
  H5:
    nodes: { h: [d, e, f, g, h] }
    parts:
      rh: { load: test-resistor, between: [h, ref], resistance: 200ohm }
  L1: { nodes: { l: [b] }, parts: { r1: { load: test-resistor, between: [l, ref], resistance: 33ohm } } }
  L2: { nodes: { l: [c] } }
  L3: { nodes: { l: [e] }, parts: { r3: { load: test-resistor, between: [l, ref], resistance: 10ohm } } }
  L4: { nodes: { l: [f] } }
  L5:
    nodes: { l: [g] }
    parts:
      g5: { source: test-step, between: [l, ref], amplitude: 1, delay: 3ns, resistance: 20ohm }
  L6: { nodes: { l: [h] }, parts: { r6: { load: test-resistor, between: [l, ref], resistance: 470ohm } } }
`;
