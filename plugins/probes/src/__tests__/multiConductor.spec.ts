import { describe, expect, it } from 'vitest';
import type { PointHandle, ProbeInstance } from '@skein/core';
// The fake solver state of core's conformance suite (two-conductor lines a, b); becomes `from '@skein/core'` once exported there.
import { createFakeProbeRig } from '@skein/core';
import { lineEndCurrentProbe, linePointProbe } from '../index.ts';

describe('lineEndCurrentProbe', () => {
  it('declares one trace per conductor of a two-conductor line, or only the one asked for', async () => {
    const rig = createFakeProbeRig(1e-9, 1e-6, 'ie');
    await lineEndCurrentProbe.create({ line: 'bundle', end: 'to' } as never, rig.ctx);
    expect(rig.traceNames).toEqual(['i.a', 'i.b']);
    const one = createFakeProbeRig(1e-9, 1e-6, 'ie');
    await lineEndCurrentProbe.create({ line: 'bundle', end: 'to', conductor: 'b' } as never, one.ctx);
    expect(one.traceNames).toEqual(['i.b']);
    const bad = createFakeProbeRig(1e-9, 1e-6, 'ie');
    expect(() => lineEndCurrentProbe.create({ line: 'bundle', end: 'to', conductor: 'c' } as never, bad.ctx)).toThrow(/conductor/);
  });
});

describe('linePointProbe', () => {
  it('sums v i over both conductors into one power trace', async () => {
    const rig = createFakeProbeRig(1e-9, 1e-6, 'pp');
    const inst = (await linePointProbe.create({ line: 'bundle', position: 40, quantity: 'power' } as never, rig.ctx)) as ProbeInstance;
    expect(rig.traceNames).toEqual(['p']);
    rig.setStep(17);
    inst.sample(rig.state);
    const h = 0 as PointHandle; // the rig hands out handles from 0
    const expected = rig.state.pointVoltage(h, 0) * rig.state.pointCurrent(h, 0) + rig.state.pointVoltage(h, 1) * rig.state.pointCurrent(h, 1);
    // Same products summed in the same order: bit for bit.
    expect(rig.traces[0][17]).toBe(expected);
    const out = inst.finish!() as { peaks: { p: { peak: number; peakAtS: number } } };
    expect(out.peaks.p).toMatchObject({ peak: expected, peakAtS: 17e-9 });
  });
  it('records v.<conductor> for voltage and i.<conductor> for current', async () => {
    const rig = createFakeProbeRig(1e-9, 1e-6, 'pv');
    await linePointProbe.create({ line: 'bundle', position: 0, quantity: 'voltage' } as never, rig.ctx);
    await linePointProbe.create({ line: 'bundle', position: 100, quantity: 'current', conductor: 'a' } as never, rig.ctx);
    expect(rig.traceNames).toEqual(['v.a', 'v.b', 'i.a']);
    expect(() => linePointProbe.create({ line: 'bundle', position: 0, conductor: 'x' } as never, rig.ctx)).toThrow(/conductor/);
  });
});
