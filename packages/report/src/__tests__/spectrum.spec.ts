import { describe, expect, it } from 'vitest';
import { InputError } from '@skein/core';
import { plotSpectrum, spectralOf } from '../index.ts';
import { FC_HZ, makeResults } from './fixtures.ts';
import { byClass, byTag, labelTexts, panels, parseSvg, pathPoints, tickX, tickY } from './svgQuery.ts';

describe('plotSpectrum', () => {
  const results = makeResults();

  it('draws magnitude and phase of every series over a log frequency axis with prefixed decades', () => {
    const doc = parseSvg(plotSpectrum(results));
    const series = byClass(doc, 'g', 'skein-series').map((g) => g.getAttribute('aria-description'));
    expect(series.sort()).toEqual(['H(load/src) magnitude', 'H(load/src) phase', 'Zin magnitude', 'Zin phase']);
    const [mag, phase] = panels(doc);
    expect(labelTexts(mag, 'x-axis tick label')).toEqual(['10 kHz', '100 kHz', '1 MHz', '10 MHz', '100 MHz']);
    expect(labelTexts(mag, 'y-axis label')).toEqual(['magnitude [dB re 1 unit]']);
    expect(labelTexts(phase, 'y-axis label')).toEqual(['phase [deg]']);
    expect(labelTexts(phase, 'y-axis tick label')).toEqual(['-180 deg', '-90 deg', '0 deg', '90 deg', '180 deg']);
  });

  it('shows the first-order low-pass at -3.01 dB and -45 deg at its corner frequency', () => {
    // |H(j fc)| = 1/sqrt(2) = -3.0103 dB, arg = -45 deg (first-order system Bode plot; e.g.
    // Oppenheim & Willsky, Signals and Systems, 2nd ed., sec. 6.5.1). The point at fc is read back
    // through the axes' tick positions; tolerance 0.02 dB / 0.05 deg for Plot's written decimals.
    const doc = parseSvg(plotSpectrum(results, { series: ['H(load/src)'] }));
    const [mag, phase] = panels(doc);
    const xFc = tickX(mag, 'x-axis tick label', '1 MHz');
    const at = (panel: typeof mag): number => {
      const pts = pathPoints(byTag(byClass(panel, 'g', 'skein-series')[0], 'path')[0].getAttribute('d')!);
      return pts.find((p) => Math.abs(p[0] - xFc) < 0.01)![1];
    };
    const y0 = tickY(mag, 'y-axis tick label', '0 dB');
    const y20 = tickY(mag, 'y-axis tick label', '-20 dB');
    expect(Math.abs(((at(mag) - y0) / (y20 - y0)) * -20 - -3.0103)).toBeLessThan(0.02);
    const p0 = tickY(phase, 'y-axis tick label', '0 deg');
    const p90 = tickY(phase, 'y-axis tick label', '-90 deg');
    expect(Math.abs(((at(phase) - p0) / (p90 - p0)) * -90 - -45)).toBeLessThan(0.05);
    expect(labelTexts(mag, 'y-axis label')).toEqual(['magnitude [dB]']);
    expect(labelTexts(panels(parseSvg(plotSpectrum(results, { series: ['Zin'] })))[0], 'y-axis label')).toEqual(['magnitude [dB re 1 ohm]']);
    expect(FC_HZ).toBe(1e6);
  });

  it('names the malformed field of doc.spectral', () => {
    const r = makeResults();
    (r.doc.spectral as { series: Array<{ re: number[] }> }).series[0].re.pop();
    let err: unknown;
    try { spectralOf(r); } catch (e) { err = e; }
    expect((err as InputError).code).toBe('E_REPORT_RESULTS');
    expect((err as InputError).path).toEqual(['spectral', 'series', 0, 're']);
    expect((err as InputError).message).toMatch(/must be a list of 61 numbers \(one per frequency\), got "60 values"/);
  });

  it('says so when the results have no spectral part', () => {
    expect(spectralOf(makeResults({ spectral: false }))).toBeUndefined();
    expect(() => plotSpectrum(makeResults({ spectral: false }))).toThrow(/spectral: must hold frequency-domain results/);
  });
});
