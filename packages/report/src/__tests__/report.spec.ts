import { describe, expect, it } from 'vitest';
import { makePlots, renderReport, SAFETY_CAUTION } from '../index.ts';
import { makeResults } from './fixtures.ts';

describe('renderReport', () => {
  const html = renderReport(makeResults());

  it('is one HTML document with the four plots inline', () => {
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(html.match(/<svg xmlns="http:\/\/www.w3.org\/2000\/svg"[^>]*class="skein-plot"/g)).toHaveLength(4);
    for (const kind of ['traces', 'space-time', 'ledger', 'spectrum']) expect(html).toContain(`data-kind="${kind}"`);
  });

  it('fetches nothing: no script, no link, no external src or href', () => {
    expect(html).not.toMatch(/<script|<link|@import|url\(\s*['"]?http/i);
    const refs = [...html.matchAll(/(?:src|href)="([^"]*)"/g)].map((m) => m[1]);
    expect(refs.length).toBeGreaterThan(0);
    expect(refs.every((r) => r.startsWith('data:') || r.startsWith('#'))).toBe(true);
  });

  it('summarises lines with Zc, velocities and delays, and the junctions', () => {
    expect(html).toContain('feeder (J1 to J2)');
    expect(html).toContain('200.0 m/us (0.667 c)'); // 2e8 m/s over c0 = 299 792 458 m/s (SI, exact)
    expect(html).toContain('125 ns'); // 25 m at 2e8 m/s
    expect(html).toMatch(/<table class="zc">.*<td>80.00<\/td><td>20.00<\/td>/s);
    expect(html).toContain('surge (source, double-exponential, a to ref)');
  });

  it('lists the ledger, peaks and escaped warnings, and ends with the safety caution', () => {
    expect(html).toContain('id="ledger-table"');
    expect(html).toMatch(/<td>delivered<\/td><td><strong>total<\/strong><\/td><td class="num">50 mJ<\/td>/);
    expect(html).toContain('branch: test warning &lt;b&gt;escaped&lt;/b&gt;');
    const footer = html.slice(html.indexOf('<footer'));
    for (const s of ['can kill', 'IEC 62305', 'IEC 61643', 'local codes', 'qualified, licensed people', 'engineering estimates']) {
      expect(footer).toContain(s);
      expect(SAFETY_CAUTION).toContain(s);
    }
  });

  it('says why a plot is absent instead of leaving a gap', () => {
    const h = renderReport(makeResults({ spectral: false, ledger: false }), { spaceTime: false });
    expect(h).toContain('Not shown: the results hold no frequency-domain part.');
    expect(h).toContain('Not shown: the scenario has no energy-ledger probe.');
    expect(h).toContain('Not shown: left out by the options.');
    expect(h.match(/class="skein-plot"/g)).toHaveLength(1);
  });
});

describe('renderReport', () => {
  it('groups probes by type in one row each', () => {
    const h = renderReport(makeResults(), { spaceTime: false, spectrum: false });
    expect(h).toContain('<tr><td>line-point</td><td>pf0, pf1, pf2, pf3, pf4, pf5, pb0, pb1, pb2, pb3, pb4</td></tr>');
    expect(h).toContain('<tr><td>energy-ledger</td><td>energy</td></tr>');
  });
});

describe('makePlots', () => {
  it('raises a malformed results field by default and turns it into a note for the report', () => {
    const r = makeResults();
    r.doc.outputs.sweep = { kind: 'space-time', positionsM: [0, 1], values: 'oops' };
    expect(() => makePlots(r)).toThrow(/outputs\.sweep\.values: must be float64 bytes or a list of rows/);
    const html = renderReport(r);
    expect(html).toContain('Not shown: the space-time data in the results is malformed: outputs.sweep.values: must be float64 bytes');
    expect(html.match(/class="skein-plot"/g)).toHaveLength(3);
  });
});
