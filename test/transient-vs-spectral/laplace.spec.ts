// Invariance: the numerical Laplace transform (timeResponse method 'laplace') of the frequency-domain
// solution against the transient solver and against the Fourier method, on the network of
// frequencyDependent.spec.ts (scenario reused): coax sections with skin effect (exact Bessel
// internal impedance, continued to complex s) and the causal Djordjevic-Sarkar dielectric, stepped
// in time by the frequency-dependent travelling-wave model; a lossless branch to a capacitor; a
// trapezoid source, transformed by its laplace hook at complex s.
import { describe, expect, it } from 'vitest';
import { resolveScenarioText } from '@skein/core';
import { timeResponse } from '@skein/spectral';
import { worstRelativeToPeak } from '../support/compare.ts';
import { runText, standardRegistry } from '../support/run.ts';

import { NET } from './coaxNetwork.ts';

describe('transient vs spectral, numerical Laplace transform', () => {
  it('agrees with the transient solver within 1 % of the peak and with the Fourier method within 1e-6', async () => {
    const r = await runText(NET, 'fd-laplace.yaml');
    const registry = await standardRegistry();
    const sc = resolveScenarioText(NET, { registry, file: 'fd-laplace.yaml' });
    const all = Array.from(r.times());
    const outputs = [{ kind: 'voltage' as const, node: 'src.s' }, { kind: 'voltage' as const, node: 'tee.t' }, { kind: 'voltage' as const, node: 'rx.r' }];
    const nlt = await timeResponse(sc, registry, { outputs, timesS: all, method: 'laplace' });
    expect(nlt.method.kind).toBe('laplace');
    // Every 5th sample for the Fourier reference (its two passes cost 4x the Laplace pass).
    const every = all.filter((_, i) => i % 5 === 0);
    const fourier = await timeResponse(sc, registry, { outputs, timesS: every });
    (['vs.v', 'vt.v', 'vr.v'] as const).forEach((trace, k) => {
      // Against the transient solver (an independent method: vector-fitted recursive convolution in
      // time): the 1 % of the issue, as for the Fourier reference in frequencyDependent.spec.ts
      // (measured 4.3e-3 at the source, 1.5e-3 at the tee, 2.1e-3 at the receiver: the transient
      // model's fits).
      const td = worstRelativeToPeak(r.series(trace), nlt.series[k].values);
      expect(td.peak).toBeGreaterThan(0.3);
      expect(td.worst, `${trace} vs transient`).toBeLessThan(0.01);
      // The two spectral methods differ (damped one pass vs two undamped passes); measured
      // 0.7e-7 to 1.4e-7 of the peak, below the Fourier method's own wrap estimate 2.4e-7; 1e-6.
      const sub = nlt.series[k].values.filter((_, i) => i % 5 === 0);
      const sp = worstRelativeToPeak(sub, fourier.series[k].values);
      expect(sp.worst, `${trace} laplace vs fourier`).toBeLessThan(1e-6);
    });
  }, 180_000);
});
