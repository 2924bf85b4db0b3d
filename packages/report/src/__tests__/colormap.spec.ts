import { describe, expect, it } from 'vitest';
import { CIVIDIS_RGB, cividis, cividisRgb, TRACE_PALETTE } from '../index.ts';

// sRGB relative luminance: IEC 61966-2-1 transfer function, Rec. ITU-R BT.709 weights (as in
// WCAG 2.1, "relative luminance").
function luminance([r, g, b]: [number, number, number]): number {
  const lin = (c: number): number => { const s = c / 255; return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4; };
  return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
}

describe('cividis', () => {
  it('holds the 256 stops of the published table', () => {
    expect(CIVIDIS_RGB.length).toBe(256 * 3);
    // First and last rows of the cividis table (Nunez, Anderton, Renslow, PLOS ONE 13(7) e0199239, 2018).
    expect(CIVIDIS_RGB.slice(0, 3)).toEqual([0, 0.135112, 0.304751]);
    expect(CIVIDIS_RGB.slice(-3)).toEqual([0.995737, 0.909344, 0.217772]);
  });
  it('maps the ends of the range to the end stops in 8-bit sRGB', () => {
    expect(cividis(0)).toBe('rgb(0, 34, 78)');
    expect(cividisRgb(1)).toEqual([254, 232, 56]);
    expect(cividisRgb(-5)).toEqual(cividisRgb(0));
    expect(cividis(Number.NaN)).toBe('none');
  });
  it('rises in luminance over all 256 stops, as a sequential map for colour-blind viewers must', () => {
    // The paper's design goal is lightness that increases linearly, so luminance must rise
    // monotonically from stop to stop. Checked on the published (unrounded) stops: 8-bit
    // rounding alone can move a level by about 1e-3.
    const y = Array.from({ length: 256 }, (_, i) => luminance([0, 1, 2].map((k) => 255 * CIVIDIS_RGB[3 * i + k]) as [number, number, number]));
    for (let i = 1; i < 256; i++) expect(y[i], `stop ${i}`).toBeGreaterThan(y[i - 1]);
    expect(y[255] / y[0]).toBeGreaterThan(20);
  });
});

describe('TRACE_PALETTE', () => {
  it('has eight distinct colours, each at least 3:1 against white (WCAG 2.1 SC 1.4.11)', () => {
    expect(new Set(TRACE_PALETTE).size).toBe(8);
    for (const h of TRACE_PALETTE) {
      const rgb: [number, number, number] = [1, 3, 5].map((k) => parseInt(h.slice(k, k + 2), 16)) as [number, number, number];
      expect((1.05 / (luminance(rgb) + 0.05))).toBeGreaterThanOrEqual(3);
    }
  });
});
