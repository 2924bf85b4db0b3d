import { describe, expect, it } from 'vitest';
import { InputError } from '@skein/core';
import { hasLedger, ledgerRows, plotLedger } from '../index.ts';
import { E0_J, makeResults, TAU_S } from './fixtures.ts';
import { byClass, byTag, labelTexts, panels, parseSvg, pathPoints, tickY } from './svgQuery.ts';

describe('plotLedger', () => {
  const results = makeResults();

  it('draws delivered, absorbed, stored and residual on an energy axis in mJ', () => {
    const doc = parseSvg(plotLedger(results));
    const series = byClass(doc, 'g', 'skein-series').map((g) => g.getAttribute('aria-description'));
    expect(series.sort()).toEqual(['energy.absorbed', 'energy.delivered', 'energy.residual', 'energy.stored']);
    expect(labelTexts(doc, 'y-axis label')).toEqual(['energy [mJ]']);
    expect(labelTexts(doc, 'y-axis tick label')).toEqual(expect.arrayContaining(['0 mJ', '10 mJ', '50 mJ']));
    expect(labelTexts(doc, 'x-axis label')).toEqual(['time [ns]']);
  });

  it('draws the delivered energy at its analytic end value', () => {
    // Delivered E0 (1 - exp(-t/tau)) at t = 399 ns: 49.935 mJ. Pixel of that value from the
    // 0 mJ and 50 mJ ticks (linear scale); tolerance 0.05 px for Plot's written decimals.
    const doc = parseSvg(plotLedger(results));
    const g = byClass(doc, 'g', 'skein-series').find((x) => x.getAttribute('aria-description') === 'energy.delivered')!;
    const pts = pathPoints(byTag(g, 'path')[0].getAttribute('d')!);
    const panel = panels(doc)[0];
    const y0 = tickY(panel, 'y-axis tick label', '0 mJ');
    const y50 = tickY(panel, 'y-axis tick label', '50 mJ');
    const want = E0_J * (1 - Math.exp(-399e-9 / TAU_S));
    expect(Math.abs(pts[pts.length - 1][1] - (y0 + (want / 0.05) * (y50 - y0)))).toBeLessThan(0.05);
  });

  it('rejects a probe that is not an energy ledger, and results without one', () => {
    let err: unknown;
    try { plotLedger(results, { probe: 'src' }); } catch (e) { err = e; }
    expect((err as InputError).code).toBe('E_REPORT_OPTION');
    expect((err as InputError).message).toMatch(/probe: must name an energy-ledger probe \(energy\), got "src"/);
    const none = makeResults({ ledger: false });
    expect(hasLedger(none)).toBe(false);
    expect(() => plotLedger(none)).toThrow(/must include a probe of type "energy-ledger"/);
  });
});

describe('ledgerRows', () => {
  it('lists per-item energies from the probe output, then the totals', () => {
    const rows = ledgerRows(makeResults());
    expect(rows.map((r) => `${r.term}:${r.item}`)).toEqual([
      'delivered:surge', 'absorbed:load', 'stored:feeder', 'stored:branch',
      'delivered:total', 'absorbed:total', 'stored:total', 'residual:total',
    ]);
    expect(rows.find((r) => r.item === 'total' && r.term === 'delivered')!.energyJ).toBe(E0_J);
  });
});
