// Lines given by cross-section geometry, through the scenario. Coax: a = 0.405 mm, b = 1.475 mm,
// er = 2.25 gives Z0 = eta0 / (2 pi sqrt(er)) ln(b/a) = 51.665 ohm and v = c / 1.5 (Pozar,
// Microwave Engineering, 4th ed., ch. 2-3, from memory; values in REFERENCES.md). A signal takes
// 5.0 ns to cross 1 m of polyethylene (common practice).
import { describe, expect, it } from 'vitest';
import { compileScenario, InputError, resolveScenarioText } from '@skein/core';
import { expectClose } from '../support/compare.ts';
import { runText, standardRegistry } from '../support/run.ts';

const COAX = `skein: 1
time: { end: 12ns, step: 0.05ns }
lines:
  cable:
    from: A
    to: B
    length: 1m
    section:
      kind: coax
      innerRadius: 0.405mm
      shieldInnerRadius: 1.475mm
      dielectric: { relPermittivity: 2.25 }
junctions:
  A:
    nodes: { a: [cable] }
    parts: { gen: { source: step, between: [a, ref], amplitude: 1, resistance: 51.665ohm } }
  B:
    nodes: { b: [cable] }
    parts: { R: { load: resistor, between: [b, ref], resistance: 51.665ohm } }
probes:
  far: { probe: node-voltage, node: B.b }
`;

describe('lines from a cross-section', () => {
  it('gives the coax its closed-form impedance and velocity', async () => {
    const registry = await standardRegistry();
    const plan = await compileScenario(resolveScenarioText(COAX, { registry, file: 'coax.yaml' }), { registry });
    // The high-frequency L and C of the section (internal inductance excluded): 1e-4 allows the
    // reference's 5 digits.
    expectClose('Z0', plan.modal[0].Zm[0], 51.665, { rel: 1e-4 });
    expectClose('velocity', plan.modal[0].velocities[0], 299792458 / 1.5, { rel: 1e-9 });
    expect(plan.warnings.some((w) => w.includes('high-frequency L and C'))).toBe(true);
  });

  it('takes 5.0 ns per metre of polyethylene-insulated coax', async () => {
    const r = await runText(COAX, 'coax.yaml');
    const v = r.series('far.v');
    const first = v.findIndex((x) => Math.abs(x) > 1e-6);
    expectClose('arrival', first * r.dtS, 5.0e-9, { rel: 0, abs: 0.051e-9 });
    expectClose('matched plateau', r.at('far.v', 10e-9), 0.5, { rel: 1e-4 });
  });

  it('locates a bad section value in the file', async () => {
    const registry = await standardRegistry();
    const bad = COAX.replace('innerRadius: 0.405mm', 'innerRadius: -0.405mm');
    let err: unknown;
    try {
      resolveScenarioText(bad, { registry, file: 'coax.yaml' });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(InputError);
    const ie = err as InputError;
    expect(ie.path).toEqual(['lines', 'cable', 'section', 'innerRadius']);
    expect(ie.location.line).toBe(10);
    expect(ie.code.startsWith('E_SECTION')).toBe(true);
  });
});
