import { computeSection } from '@skein/lines';
import { vectorFit } from '/work/main/packages/core/src/line/vectorFitting.ts';
import { lineFunctions, fitFdLine } from '/work/main/packages/core/src/line/fdLine.ts';
const section = computeSection({ kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric: { relPermittivity: 2.25, lossTangent: 2e-4 } });
const w = Float64Array.from({ length: 181 }, (_, i) => 2 * Math.PI * 10 ** (3 + 6 * i / 180));
for (const L of [10]) {
  const lf = lineFunctions(section, L, w);
  for (const asym of ['none', 'constant'] as const) for (const np of [8, 10, 12, 16]) for (const sp of ['real', 'complex'] as const) {
    const fit = vectorFit(w, lf.hRe, lf.hIm, { nPoles: np, startPoles: sp, asymptote: asym, iterations: 20 });
    console.log(L, asym, np, sp, fit.rmsRelativeError.toExponential(2));
  }
}
for (const L of [10, 100, 1000, 1e5]) {
  const t0 = performance.now();
  const m = fitFdLine(section, L, { fMinHz: 1e3, fMaxHz: 1e9 });
  console.log(L, (performance.now() - t0).toFixed(0), 'ms', m.tauS / m.losslessDelayS, m.errors, m.bands.h, m.passivity);
}
