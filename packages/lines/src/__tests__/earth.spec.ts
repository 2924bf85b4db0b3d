import { describe, it, expect } from 'vitest';
import { carsonEarthImpedance, complexDepthEarthImpedance, MU0 } from '../index.ts';
import { expectClose } from './compare.ts';

describe('carsonEarthImpedance', () => {
  it("gives Carson's low-frequency earth-return resistance omega mu0 / 8", () => {
    // J. R. Carson, Bell Syst. Tech. J. 5, 539-554, 1926; REFERENCES.md: 0.0493480 ohm/km at 50 Hz,
    // 0.0592176 ohm/km at 60 Hz. Wire 1 m high over 1000 ohm*m earth: Carson's first correction
    // (sqrt2/6) k with k = 2h sqrt(omega mu0 sigma) = 1.3e-3 is 0.08 % -> tolerance 1e-3.
    const r50 = carsonEarthImpedance(1, 1, 0, 50, { resistivityOhmM: 1000 }).re;
    const r60 = carsonEarthImpedance(1, 1, 0, 60, { resistivityOhmM: 1000 }).re;
    expectClose('50 Hz', r50 * 1000, 0.049348, 1e-3);
    expectClose('60 Hz', r60 * 1000, 0.0592176, 1e-3);
  });

  it("matches Carson's series to second order for self and mutual terms", () => {
    // Carson 1926, series for small k (coefficients from memory):
    // P = pi/8 - b1 k cos(theta) + b2 [(c2 - ln k) k^2 cos(2 theta) + theta k^2 sin(2 theta)] + O(k^3),
    // b1 = sqrt2/6, b2 = 1/16, c2 = 1.3659315; R = (omega mu0/pi) P, k = D' sqrt(omega mu0 sigma),
    // D' the distance to the image, theta its angle from the vertical. h = 10 m, 100 ohm*m, 50 Hz:
    // k = 0.04, the O(k^3) term is ~ 1e-6 of pi/8 -> tolerance 1e-4.
    const f = 50;
    const w = 2 * Math.PI * f;
    const m = Math.sqrt((w * MU0) / 100);
    for (const [hi, hj, x] of [[10, 10, 0], [10, 12, 5]]) {
      const D = Math.hypot(hi + hj, x);
      const th = Math.atan2(x, hi + hj);
      const k = D * m;
      const P = Math.PI / 8 - (Math.SQRT2 / 6) * k * Math.cos(th) + (1 / 16) * ((1.3659315 - Math.log(k)) * k * k * Math.cos(2 * th) + th * k * k * Math.sin(2 * th));
      const expected = ((w * MU0) / Math.PI) * P;
      expectClose(`R(${hi},${hj},${x})`, carsonEarthImpedance(hi, hj, x, f, { resistivityOhmM: 100 }).re, expected, 1e-4);
    }
  });

  it('matches an independent quadrature of the same integral at high frequency', () => {
    // mpmath 1.3.0 quad of Carson's integral (general reference library), h = 10 m, x = 3 m, 1 MHz, 100 ohm*m.
    const z = carsonEarthImpedance(10, 10, 3, 1e6, { resistivityOhmM: 100 });
    expectClose('Re', z.re, 0.244027328369501, 1e-9);
    expectClose('Im', z.im, 0.301275525295266, 1e-9);
  });

  it('is zero at DC and symmetric in the two wires', () => {
    expect(carsonEarthImpedance(10, 10, 0, 0, { resistivityOhmM: 100 })).toEqual({ re: 0, im: 0 });
    const a = carsonEarthImpedance(8, 12, 4, 1e4, { resistivityOhmM: 100 });
    const b = carsonEarthImpedance(12, 8, -4, 1e4, { resistivityOhmM: 100 });
    expect(a.re).toBe(b.re);
    expect(a.im).toBe(b.im);
  });
});

describe('complexDepthEarthImpedance', () => {
  it("agrees with Carson's integral within a few percent from 50 Hz to 10 MHz", () => {
    // Deri, Tevan, Semlyen, Castanheira, IEEE Trans. PAS-100(8), 1981 (from memory): the complex
    // depth is within a few percent of Carson everywhere; the worst case is near |p| ~ h.
    // Tolerance 5 % of |dZ|.
    for (const f of [50, 1e3, 1e5, 1e6, 1e7]) {
      for (const [hi, hj, x] of [[10, 10, 0], [10, 12, 5]]) {
        const c = carsonEarthImpedance(hi, hj, x, f, { resistivityOhmM: 100 });
        const d = complexDepthEarthImpedance(hi, hj, x, f, { resistivityOhmM: 100 });
        const mag = Math.hypot(c.re, c.im);
        expectClose(`Re f=${f}`, d.re, c.re, 0, 0.05 * mag);
        expectClose(`Im f=${f}`, d.im, c.im, 0, 0.05 * mag);
      }
    }
  });

  it('tends to omega mu0/8 resistance at low frequency as well', () => {
    // Deri et al. 1981: the low-frequency limit of the complex depth reproduces Carson's pi/8 term.
    expectClose('50 Hz', complexDepthEarthImpedance(1, 1, 0, 50, { resistivityOhmM: 1000 }).re, (2 * Math.PI * 50 * MU0) / 8, 2e-3);
  });
});
