// Minimal plugins for core's own unit tests. Core names no concrete plugin; the standard set lives
// in plugins/*. These exist so core can be tested alone, and they double as a check that the
// public plugin API is enough to write a plugin.
import { defineLoad, defineProbe, defineSource, PluginRegistry, type NodeHandle, type TraceHandle } from '../index.ts';

export const stepSource = defineSource({
  type: 'test-step',
  summary: 'ideal step at t = delay',
  params: { amplitude: { unit: '1', summary: 'height', default: 1 }, delay: { unit: 's', summary: 'start', default: 0 } },
  create: (p) => ({ value: (t: number) => (t >= p.delay ? p.amplitude : 0) }),
});

export const resistorLoad = defineLoad({
  type: 'test-resistor',
  summary: 'resistor',
  params: { resistance: { unit: 'ohm', summary: 'R', min: 0, exclusiveMin: true } },
  create: (p) => ({ kind: 'linear', conductanceS: 1 / p.resistance }),
});

export const capacitorLoad = defineLoad({
  type: 'test-capacitor',
  summary: 'capacitor, trapezoidal companion',
  params: { capacitance: { unit: 'F', summary: 'C', min: 0, exclusiveMin: true } },
  create: (p, ctx) => {
    const g = (2 * p.capacitance) / ctx.dtS;
    let vPrev = 0;
    let iPrev = 0;
    return {
      kind: 'linear',
      conductanceS: g,
      history: () => -(g * vPrev + iPrev),
      accept: (v: number, i: number) => { vPrev = v; iPrev = i; },
      storedEnergyJ: () => 0.5 * p.capacitance * vPrev * vPrev,
    };
  },
});

export const nodeProbe = defineProbe({
  type: 'test-node',
  summary: 'node voltage',
  params: { node: { kind: 'string', summary: 'junction.node' } },
  create: (p, ctx) => {
    const h: NodeHandle = ctx.node(p.node, 'node');
    const tr: TraceHandle = ctx.trace('v', 'V');
    return { sample: (s) => s.record(tr, s.nodeVoltage(h)) };
  },
});

export const ledgerProbe = defineProbe({
  type: 'test-ledger',
  summary: 'ledger totals',
  params: {},
  create: (_p, ctx) => {
    ctx.useLedger();
    const d = ctx.trace('delivered', 'J');
    const a = ctx.trace('absorbed', 'J');
    const s = ctx.trace('stored', 'J');
    return {
      sample: (st) => {
        const l = st.ledger();
        st.record(d, l.deliveredTotalJ);
        st.record(a, l.absorbedTotalJ);
        st.record(s, l.storedTotalJ);
      },
    };
  },
});

export function testRegistry(): PluginRegistry {
  const r = new PluginRegistry();
  for (const p of [stepSource, resistorLoad, capacitorLoad, nodeProbe, ledgerProbe]) r.register(p, 'core/__tests__/fixtures.ts');
  return r;
}
