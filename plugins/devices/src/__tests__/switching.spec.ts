import { describe, expect, it } from 'vitest';
import type { LinearLoadInstance } from '@skein/core';
import { controlledSwitchLoad, rampedSwitchLoad, sparkGapLoad, type ControlledSwitchDevice, type SparkGapDevice } from '../index.ts';
import { current, expectClose, makeLoad, testContext } from './helpers.ts';

/** Steps a device's hooks under a prescribed v(t) for n steps of dt; returns the currents. */
function drive(d: { evaluate(v: number, t: number, o: Float64Array): void; accept?(v: number, i: number, t: number): void }, v: (t: number) => number, n: number, dt: number, k0 = 0): Float64Array {
  const out = new Float64Array(2);
  const is = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const t = (k0 + k) * dt;
    d.evaluate(v(t), t, out);
    is[k] = out[0];
    d.accept?.(v(t), out[0], t);
  }
  return is;
}

describe('sparkGapLoad', () => {
  const base = { sparkoverVoltage: 90, timeLag: 100e-9, arcVoltage: 15, arcResistance: 0.1, holdingCurrent: 0.1, arcCorner: 0.5 };

  it('breaks down after its time lag above the static sparkover voltage, burns its arc, and goes out below the holding current', () => {
    // Ramp 1 kV/us: |v| reaches 90 V at 90 ns; with the constant time lag of 100 ns it breaks
    // down at 190 ns, at 190 V (volt-time model: V_bd = Vdc + S lag). One step (1 ns, 1 V) of slack.
    const dt = 1e-9;
    const d = makeLoad<SparkGapDevice>(sparkGapLoad, base, testContext(dt));
    const seq: boolean[] = [];
    const v = (t: number): number => (t <= 300e-9 ? 1e9 * t : t <= 400e-9 ? 20 : 10);
    const out = new Float64Array(2);
    for (let k = 0; k <= 500; k++) {
      const t = k * dt;
      // evaluate never changes the state: call it many times, far above the sparkover voltage.
      for (let j = 0; j < 3; j++) d.evaluate(1e4, t, out);
      d.evaluate(v(t), t, out);
      d.accept(v(t), out[0], t);
      if (seq.length === 0 || seq[seq.length - 1] !== d.conducting) seq.push(d.conducting);
    }
    expect(seq).toEqual([false, true, false]);
    const r = d.finish() as { events: Array<{ kind: string; timeS: number; voltageV: number }>; breakdowns: number };
    expect(r.breakdowns).toBe(1);
    expect(r.events.map((e) => e.kind)).toEqual(['breakdown', 'extinction']);
    expectClose('breakdown time', r.events[0].timeS, 190e-9, 0, 1.01e-9);
    expectClose('breakdown voltage', r.events[0].voltageV, 190, 0, 1.01);
    // At 20 V the arc carries (20 - 15)/0.1 = 50 A (the corner's softplus adds w ln(1+e^-10)/R ~ 0.2 mA);
    // at 10 V only the corner's tail, 0.23 mA < 0.1 A: it goes out at the first step at 10 V (400 or 401 ns, as t = k dt rounds against 400 ns).
    expectClose('extinction time', r.events[1].timeS, 400.5e-9, 0, 0.51e-9);
  });

  it('breaks down at a higher voltage under a steeper ramp: V_bd = Vdc + S lag', () => {
    for (const s of [0.5e9, 2e9, 5e9]) {
      const dt = 0.1e-9;
      const d = makeLoad<SparkGapDevice>(sparkGapLoad, base, testContext(dt));
      drive(d, (t) => s * t, 4000, dt);
      const r = d.finish() as { firstBreakdownVoltageV: number };
      // One step of slack: S dt (0.05 to 0.5 V).
      expectClose(`V_bd at ${s / 1e9} kV/us`, r.firstBreakdownVoltageV, 90 + s * 100e-9, 0, s * dt * 1.01);
    }
  });

  it('has a smooth, monotone arc characteristic: i -> (|v| - Va)/Rarc well above the arc voltage', () => {
    const d = makeLoad<SparkGapDevice>(sparkGapLoad, { ...base, timeLag: 0 }, testContext(1e-9));
    d.accept(100, current(d, 100), 1e-9); // breaks down
    expect(d.conducting).toBe(true);
    // (30 - 15)/0.1 = 150 A; the softplus adds w ln(1 + e^-30) ~ 5e-14 V: 1e-12 relative.
    expectClose('i(30 V)', current(d, 30), 150 + 30e-9, 1e-12);
    expectClose('odd', current(d, -30), -current(d, 30), 1e-12);
    let prev = -Infinity;
    for (let v = -40; v <= 40; v += 0.01) {
      const i = current(d, v);
      expect(i).toBeGreaterThanOrEqual(prev);
      prev = i;
    }
  });
});

describe('controlledSwitchLoad', () => {
  it('trips open on overcurrent and stays open when latched; the state changes only in accept', () => {
    const dt = 1e-9;
    const d = makeLoad<ControlledSwitchDevice>(controlledSwitchLoad, { control: 'current', action: 'open', threshold: 100, latch: true, initiallyClosed: true, onResistance: 1e-3 }, testContext(dt));
    const out = new Float64Array(2);
    // v = 1 mV/ns: i = v / 1 mohm = 1 A/ns, above 100 A after 100 ns.
    let openedAt = -1;
    for (let k = 0; k < 300; k++) {
      const t = k * dt;
      const v = k < 200 ? 1e-3 * k : 0;
      d.evaluate(v, t, out);
      d.accept(v, out[0], t);
      if (!d.closed && openedAt < 0) openedAt = k;
    }
    expect(openedAt).toBe(101); // first accepted step with |i| > 100 A
    expect(d.closed).toBe(false); // latched: the current falling to 0 does not reclose it
    d.evaluate(1, 0, out);
    expectClose('open conductance', out[1], 1e-9, 1e-12);
    const r = d.finish() as { switchings: number; peakCurrentA: number };
    expect(r.switchings).toBe(1);
    expectClose('peak current', r.peakCurrentA, 101, 1e-12);
  });

  it('closes above its voltage threshold, opens below threshold - hysteresis, and ramps its resistance geometrically', () => {
    const dt = 1e-9;
    const d = makeLoad<ControlledSwitchDevice>(controlledSwitchLoad, { control: 'voltage', action: 'close', threshold: 50, hysteresis: 20, transitionTime: 10e-9, onResistance: 1, offResistance: 1e6 }, testContext(dt));
    const out = new Float64Array(2);
    d.evaluate(60, 0, out);
    expect(d.closed).toBe(false);
    d.accept(60, out[0], 0); // above 50 V: closes, ramp starts at t = 0
    expect(d.closed).toBe(true);
    // Half-way through the ramp: geometric mean of the end conductances, 1e-3 S.
    d.evaluate(1, 5e-9, out);
    expectClose('g at mid-ramp', out[1], Math.sqrt(1 * 1e-6), 1e-12);
    d.evaluate(1, 20e-9, out);
    expectClose('g after the ramp', out[1], 1, 1e-12);
    d.accept(40, 40, 20e-9); // 40 V: inside the hysteresis band, stays closed
    expect(d.closed).toBe(true);
    d.accept(29, 29, 21e-9); // below 30 V: opens
    expect(d.closed).toBe(false);
  });
});

describe('rampedSwitchLoad', () => {
  it('closes through a pre-insertion resistor with geometric ramps and records the resistor duty', () => {
    const p = { closeAt: 1e-3, rampTime: 1e-6, onResistance: 1e-3, offResistance: 1e9, preInsertionResistance: 400, insertionTime: 8e-3, openAt: 20e-3 };
    const sw = makeLoad<LinearLoadInstance>(rampedSwitchLoad, p, testContext(1e-6));
    const g = (t: number): number => sw.conductanceAt?.(t) ?? NaN;
    expectClose('open', g(0.5e-3), 1e-9, 1e-12);
    expectClose('mid first ramp: sqrt(Roff Rpre)', 1 / g(1e-3 + 0.5e-6), Math.sqrt(1e9 * 400), 1e-9);
    expectClose('inserted', 1 / g(5e-3), 400, 1e-12);
    expectClose('mid bypass ramp: sqrt(Rpre Ron)', 1 / g(9e-3 + 0.5e-6), Math.sqrt(400 * 1e-3), 1e-9);
    expectClose('closed', 1 / g(15e-3), 1e-3, 1e-12);
    expectClose('open again', 1 / g(25e-3), 1e9, 1e-12);
    expect(sw.conductanceS).toBe(g(0));
    // Duty of the resistor: 10 kV across for its 8 ms insertion (v^2/R t = 2 MJ, exact for constant power).
    for (let k = 0; k <= 8000; k++) {
      const t = 1.001e-3 + k * 1e-6;
      sw.accept?.(10e3, 10e3 / 400, t);
    }
    const r = sw.finish?.() as { energyJ: number };
    // From rest at t = 0 to the first sample at 1.001 ms the step-centred product counts
    // (v/2)(i/2) over that interval: a quarter of the power.
    expectClose('energy', r.energyJ, (10e3 * 10e3) / 400 * (8e-3 + 1.001e-3 / 4), 1e-9);
  });

  it('rejects an insertion time without a pre-insertion resistance, naming the parameter', () => {
    expect(() => makeLoad(rampedSwitchLoad, { insertionTime: 1e-3 })).toThrow(/preInsertionResistance/);
    expect(() => makeLoad(rampedSwitchLoad, { closeAt: 1e-3, openAt: 0.5e-3 })).toThrow(/openAt/);
  });
});
