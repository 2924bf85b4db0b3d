// The frequency-dependent line model on lines with closed-form answers: a lossless line (Bewley's
// lattice) and Heaviside's distortionless line; the comparison with the frequency-domain solver
// on a skin-effect coax is in test/fd-line/fdLine.spec.ts.
import { describe, expect, it } from 'vitest';
import { computeSection, type LineSection } from '@skein/lines';
import { fitFdLine, lineFunctions, simulateFdLine } from '../fdLine.ts';

/** A one-conductor section with constant R, L, G, C (invented test data). */
function constantSection(R: number, L: number, G: number, C: number): LineSection {
  return {
    conductors: ['a'], n: 1, L: Float64Array.of(L), C: Float64Array.of(C),
    rlgcAt: () => ({ R: Float64Array.of(R), L: Float64Array.of(L), G: Float64Array.of(G), C: Float64Array.of(C) }),
    zyAt: (f: number) => ({ Zre: Float64Array.of(R), Zim: Float64Array.of(2 * Math.PI * f * L), Yre: Float64Array.of(G), Yim: Float64Array.of(2 * Math.PI * f * C) }),
    describe: 'constant RLGC',
  } as LineSection;
}

describe('simulateFdLine', () => {
  it('reproduces the Bewley lattice of a lossless line', () => {
    // REFERENCES.md: 1 V step, Rs = 25 ohm, Z0 = 50 ohm, RL = 100 ohm, one-way delay 1 us
    // (Bewley, Trans. AIEE 50, 1931, from memory). L = 250 nH/m, C = 100 pF/m: Z0 = 50 ohm,
    // v = 2e8 m/s, so 200 m take 1 us.
    const section = constantSection(0, 250e-9, 0, 100e-12);
    const dt = 1e-9;
    const r = simulateFdLine({
      section, lengthM: 200, dtS: dt, steps: 8000, source: { v: (t) => (t > 0 ? 1 : 0), resistanceOhm: 25 }, loadR: 100,
      fit: { ycPoles: 1, hPoles: 1, hAsymptote: 'constant', fMinHz: 1e3, fMaxHz: 1e8 },
    });
    // The delay search finds the lossless delay (golden section to ~1e-5 of tau).
    expect(Math.abs(r.model.tauS - 1e-6)).toBeLessThan(1e-10);
    // Plateau values to 1e-6: the fitted Yc and H' are constants to rounding; the samples sit
    // mid-plateau, away from the one-step ramp of the edges.
    const at = (a: Float64Array, t: number) => a[Math.round(t / dt)];
    expect(at(r.vFar, 2e-6)).toBeCloseTo(0.88888889, 6);
    expect(at(r.vFar, 4e-6)).toBeCloseTo(0.79012346, 6);
    expect(at(r.vFar, 6e-6)).toBeCloseTo(0.80109739, 6);
    expect(at(r.vNear, 1e-6)).toBeCloseTo(0.66666667, 6);
    expect(at(r.vNear, 3e-6)).toBeCloseTo(0.81481481, 6);
    expect(Math.abs(r.vFar[0])).toBe(0);
  });

  it('delays a Gaussian on the distortionless line by l/v and scales it by exp(-alpha l)', () => {
    // Heaviside's distortionless line (REFERENCES.md): L = 250 nH/m, C = 100 pF/m, R = 0.05
    // ohm/m, G = 2e-5 S/m: Z0 = 50 ohm, v = 2e8 m/s, alpha = 1e-3 Np/m. 1 km, matched at both
    // ends: the far end is (1/2) e^-1 v_s(t - 5 us).
    const section = constantSection(0.05, 250e-9, 2e-5, 100e-12);
    const dt = 1e-9;
    const sigma = 50e-9;
    const t0 = 400e-9;
    const vs = (t: number) => Math.exp(-(((t - t0) / sigma) ** 2) / 2);
    const r = simulateFdLine({
      section, lengthM: 1000, dtS: dt, steps: 7000, source: { v: vs, resistanceOhm: 50 }, loadR: 50,
      fit: { ycPoles: 1, hPoles: 1, hAsymptote: 'constant', fMinHz: 1e3, fMaxHz: 1e8 },
    });
    let worst = 0;
    for (let n = 0; n < 7000; n++) worst = Math.max(worst, Math.abs(r.vFar[n] - 0.5 * Math.exp(-1) * vs(n * dt - 5e-6)));
    // Piecewise-linear sampling of the Gaussian at dt = sigma/50: error ~ (dt/sigma)^2/8 of the
    // peak = 5e-5 at worst; 1e-4 of the 0.184 V peak leaves room for the delay search's 1e-5 tau.
    expect(worst / (0.5 * Math.exp(-1))).toBeLessThan(1e-4);
    expect(r.vNear[Math.round(t0 / dt)]).toBeCloseTo(0.5, 6);
  });

  it('settles to the DC voltage divider of the line resistance on a skin-effect coax', () => {
    // Ohm's law (common practice): 1 km of the coax, 1 V behind 50 ohm into 50 ohm, settles at
    // 50 / (100 + R_dc l) with the section's DC resistance (33.4 ohm). The fits start at 1 Hz;
    // Yc(0) = 0 and H(0) = 1 are extrapolated by the rational functions, whose error at the band
    // edge (1e-3) bounds the tolerance; measured 7e-5 (far end) and 1e-5 (near end).
    const section = computeSection({ kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric: { relPermittivity: 2.25, lossTangent: 2e-4 } });
    const rdc = section.rlgcAt(0).R[0] * 1000;
    expect(rdc).toBeGreaterThan(30);
    const r = simulateFdLine({ section, lengthM: 1000, dtS: 1e-8, steps: 100_000, source: { v: (t) => Math.min(1, t / 20e-9), resistanceOhm: 50 }, loadR: 50 });
    const want = 50 / (100 + rdc);
    expect(Math.abs(r.vFar[99_999] / want - 1)).toBeLessThan(2e-3);
    expect(Math.abs(r.vNear[99_999] / ((50 + rdc) / (100 + rdc)) - 1)).toBeLessThan(2e-3);
  });

  it('names the bad input', () => {
    const section = constantSection(0, 250e-9, 0, 100e-12);
    const base = { section, lengthM: 1, steps: 10, source: { v: () => 1, resistanceOhm: 50 }, loadR: 50, fit: { ycPoles: 1, hPoles: 1, hAsymptote: 'constant' as const } };
    expect(() => simulateFdLine({ ...base, dtS: 1e-8 })).toThrow(/simulateFdLine.dtS: must not exceed the line's delay/);
    expect(() => simulateFdLine({ ...base, dtS: -1 })).toThrow(/simulateFdLine.dtS/);
    expect(() => simulateFdLine({ ...base, dtS: 1e-10, loadR: -5 })).toThrow(/simulateFdLine.loadR/);
  });
});

describe('fitFdLine', () => {
  const coax = computeSection({ kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric: { relPermittivity: 2.25, lossTangent: 2e-4, model: 'djordjevic-sarkar' } });

  it('rejects a multiconductor section with the reason', () => {
    const two = computeSection({ kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric: { relPermittivity: 2.25 }, shield: { thickness: 1e-4 }, overGround: { height: 0.05, ground: 'perfect' } });
    expect(() => fitFdLine(two, 10)).toThrow(/fdLine.section.conductors: must be one conductor/);
  });

  it('takes out a delay within 0.1 % of the lossless one and keeps the fits passive', () => {
    const m = fitFdLine(coax, 100, { fMinHz: 1e3, fMaxHz: 1e9 });
    // The Djordjevic-Sarkar dielectric's eps_inf (at its 1 THz corner) is below 2.25, so the
    // lossless delay is slightly below l / (c / 1.5); with a constant er = 2.25 it is exactly
    // that (REFERENCES.md, v = c/1.5; the section's L', C' match Pozar to 2e-6).
    expect(m.losslessDelayS).toBeLessThan(100 * 1.5 / 299792458);
    const plain = computeSection({ kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric: { relPermittivity: 2.25 } });
    const tau0 = lineFunctions(plain, 100, Float64Array.of(1)).losslessDelayS;
    expect(Math.abs(tau0 / (100 * 1.5 / 299792458) - 1)).toBeLessThan(1e-6);
    expect(Math.abs(m.tauS / m.losslessDelayS - 1)).toBeLessThan(1e-3);
    expect(m.passivity.yc.worstAfter).toBeGreaterThanOrEqual(0);
    expect(m.passivity.h.worstAfter).toBeLessThanOrEqual(1);
    expect(m.errors.ycRmsRelative).toBeLessThan(1e-3);
    // Absolute error of H' (|H'| <= 1) over its band.
    expect(m.errors.hRmsAbsolute).toBeLessThan(1e-3);
    for (const p of m.yc.polesRe) expect(p).toBeLessThan(0);
    for (const p of m.h.polesRe) expect(p).toBeLessThan(0);
  });

  // 10 m of the REFERENCES.md coax (a = 0.405 mm, b = 1.475 mm, er = 2.25, copper inner, perfect
  // shield) over 1 kHz..1 GHz, 20 samples per decade, 12 poles for Yc, 10 for H'.
  const band = { fMinHz: 1e3, fMaxHz: 1e9, ycPoles: 12, hPoles: 10 };
  it('fits Yc and H of the skin-effect coax with a causal dielectric within 1e-3 rms', () => {
    const m = fitFdLine(coax, 10, band);
    // The issue asks 1e-3; measured 2.3e-5 (Yc) and 6.1e-5 (H').
    expect(m.errors.ycRmsRelative).toBeLessThan(1e-3);
    expect(m.errors.hRmsRelative).toBeLessThan(1e-3);
    expect(m.passivity.yc.worstAfter).toBeGreaterThanOrEqual(0);
    expect(m.passivity.h.worstAfter).toBeLessThanOrEqual(1);
    // High-frequency limit of Yc: 1/Z0 = 1/51.665 ohm (Pozar, REFERENCES.md) with er(1 THz)
    // of the causal model a little below 2.25, and internal inductance: within 1 %.
    expect(Math.abs(m.yc.d * 51.665 - 1)).toBeLessThan(1e-2);
  });

  it('fits the constant-loss-tangent coax: Yc within 1e-3, H at the floor the non-causal loss sets', () => {
    // A loss tangent constant over frequency violates Kramers-Kronig (its permittivity should
    // vary with it): |H| falls like exp(-w tau tan(d)/2) with no matching phase, which no causal
    // rational function follows. Measured: Yc 8e-5, H' 3.2e-3 rms; the same line without the
    // dielectric loss fits H' to 6e-5, so the floor is the data's, not the method's.
    const brief = computeSection({ kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric: { relPermittivity: 2.25, lossTangent: 2e-4 } });
    const m = fitFdLine(brief, 10, band);
    expect(m.errors.ycRmsRelative).toBeLessThan(1e-3);
    expect(m.errors.hRmsRelative).toBeLessThan(5e-3);
    expect(m.passivity.yc.worstAfter).toBeGreaterThanOrEqual(0);
    expect(m.passivity.h.worstAfter).toBeLessThanOrEqual(1);
    const lossless = computeSection({ kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric: { relPermittivity: 2.25 } });
    expect(fitFdLine(lossless, 10, band).errors.hRmsRelative).toBeLessThan(1e-3);
  });

  it('samples H with the chosen delay taken out', () => {
    const w = Float64Array.of(2 * Math.PI * 1e6);
    const a = lineFunctions(coax, 100, w, 0);
    const b = lineFunctions(coax, 100, w, 1e-7);
    // H' differs by the factor exp(j w tau) only.
    const pa = Math.atan2(a.hIm[0], a.hRe[0]);
    const pb = Math.atan2(b.hIm[0], b.hRe[0]);
    const dp = Math.atan2(Math.sin(pb - pa), Math.cos(pb - pa));
    expect(dp).toBeCloseTo(2 * Math.PI * 1e6 * 1e-7, 12);
    expect(Math.hypot(a.hRe[0], a.hIm[0])).toBeCloseTo(Math.hypot(b.hRe[0], b.hIm[0]), 14);
  });
});
