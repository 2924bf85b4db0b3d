import { describe, expect, it } from 'vitest';
import { assertPluginConformance, checkPluginConformance, createFakeProbeRig } from '../index.ts';
import type { ConformanceReport } from '../report.ts';

const fixture = (name: string): string => new URL(`./fixtures/${name}`, import.meta.url).href;
const check = (r: ConformanceReport, plugin: string, name: string) => r.checks.find((c) => c.plugin === plugin && c.name === name);

describe('checkPluginConformance', () => {
  it('passes a plugin that follows every rule, loaded by relative path from a worker', async () => {
    const r = await checkPluginConformance('./fixtures/goodPlugin.ts', { parentUrl: import.meta.url });
    expect(r.ok, JSON.stringify(r.checks.filter((c) => !c.ok))).toBe(true);
    expect(r.plugins).toEqual(['load:fixture-inductor']);
    expect(r.url).toBe(fixture('goodPlugin.ts'));
  });

  it('catches per-step allocation, shared state, a throwing finish, missing units and a bad type name', async () => {
    const r = await checkPluginConformance(fixture('badPlugins.ts'));
    expect(r.ok).toBe(false);
    const alloc = check(r, 'source:allocating-wave', 'no-step-allocation')!;
    expect(alloc.ok, alloc.message).toBe(false);
    // An array of two doubles costs at least 16 B (header) + 2 x 8 B: far above the bound per call.
    expect(alloc.message).toMatch(/allocate/);
    expect(check(r, 'load:sharing-capacitor', 'no-shared-state')!.ok).toBe(false);
    expect(check(r, 'probe:throwing-probe', 'finish-after-failure')!.ok).toBe(false);
    expect(check(r, 'probe:throwing-probe', 'finish-after-failure')!.message).toMatch(/cannot finish/);
    const schema = check(r, 'source:unitless-wave', 'param-schema')!;
    expect(schema.ok).toBe(false);
    expect(schema.message).toMatch(/level: needs a unit/);
    expect(schema.message).toMatch(/delay: needs a summary/);
    const camel = r.checks.find((c) => c.name === 'plugin-shape' && !c.ok)!;
    expect(camel.message).toMatch(/camelWave.*kebab-case/);
    // The rule-abiding hooks of the same module pass their own checks (the sharing load also
    // allocates: a double written to a module variable is boxed anew each step).
    expect(check(r, 'probe:throwing-probe', 'no-shared-state')!.ok).toBe(true);
  });

  it('reports a module that does not load or has no default export as a failed check', async () => {
    const missing = await checkPluginConformance('./fixtures/doesNotExist.ts', { parentUrl: import.meta.url });
    expect(missing.ok).toBe(false);
    expect(missing.checks[0].name).toBe('loads-in-worker');
    const empty = await checkPluginConformance('./fixtures/noDefault.ts', { parentUrl: import.meta.url });
    expect(empty.checks[0]).toMatchObject({ name: 'loads-in-worker', ok: false });
    expect(empty.checks[0].message).toMatch(/no default export/);
  });
});

describe('assertPluginConformance', () => {
  it('throws E_CONFORMANCE listing each failed check', async () => {
    await expect(assertPluginConformance(fixture('badPlugins.ts'))).rejects.toMatchObject({ code: 'E_CONFORMANCE' });
    await expect(assertPluginConformance(fixture('badPlugins.ts'))).rejects.toThrow(/allocating-wave: no-step-allocation/);
  });
});

describe('createFakeProbeRig', () => {
  it('records into per-trace rings and rejects conductors a line does not have', () => {
    const rig = createFakeProbeRig(1e-9, 1e-6, 'p');
    const tr = rig.ctx.trace('v', 'V');
    const n = rig.ctx.node('J1.a');
    rig.setStep(3);
    rig.state.record(tr, rig.state.nodeVoltage(n));
    expect(rig.traces[0][3]).toBe(Math.sin(3e-3));
    expect(() => rig.ctx.lineEnd('l', 'from', 'zz', 'conductor')).toThrow(/conductor/);
  });
});
