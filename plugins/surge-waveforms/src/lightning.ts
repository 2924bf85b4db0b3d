/**
 * `lightning-current`: the IEC 62305-1 lightning currents as Heidler functions
 * i(t) = (I/k) (t/tau1)^10 / (1 + (t/tau1)^10) exp(-t/tau2), in amperes (use `drive: current`).
 *
 * Parameters for protection level I (IEC 62305-1, Annex B, table of Heidler parameters; from memory
 * except the first positive stroke, which is in the project's vetted references):
 *  - first positive 10/350 us: I = 200 kA, k = 0.93, tau1 = 19.0 us, tau2 = 485 us;
 *  - first negative 1/200 us: I = 100 kA, k = 0.986, tau1 = 1.82 us, tau2 = 285 us;
 *  - subsequent 0.25/100 us: I = 50 kA, k = 0.993, tau1 = 0.454 us, tau2 = 143 us.
 * Level II takes 75 % of level I's peak, levels III and IV 50 % (same time constants).
 */
import { defineSource } from '@skein/core';
import { heidler } from './heidler.ts';

/** One stroke's Heidler parameters at protection level I: peak [A], k [1], tau1 [s], tau2 [s], n [1]. @example LIGHTNING_STROKES['first-positive'].tau2S // 485e-6 */
export interface HeidlerStroke {
  peakA: number;
  k: number;
  tau1S: number;
  tau2S: number;
  n: number;
}

/** Heidler parameters by stroke at level I (IEC 62305-1 Annex B, from memory; see the module doc). */
export const LIGHTNING_STROKES: Readonly<Record<'first-positive' | 'first-negative' | 'subsequent', HeidlerStroke>> = {
  'first-positive': { peakA: 200e3, k: 0.93, tau1S: 19.0e-6, tau2S: 485e-6, n: 10 },
  'first-negative': { peakA: 100e3, k: 0.986, tau1S: 1.82e-6, tau2S: 285e-6, n: 10 },
  subsequent: { peakA: 50e3, k: 0.993, tau1S: 0.454e-6, tau2S: 143e-6, n: 10 },
};

/** Peak scale of each protection level relative to level I (IEC 62305-1, from memory). */
export const LIGHTNING_LEVEL_SCALE: Readonly<Record<'I' | 'II' | 'III' | 'IV', number>> = { I: 1, II: 0.75, III: 0.5, IV: 0.5 };

/** Nominal front times [s] of the strokes, for the automatic time step. */
const FRONT_S = { 'first-positive': 10e-6, 'first-negative': 1e-6, subsequent: 0.25e-6 } as const;

/**
 * The lightning-current source plugin. Params: `stroke` ('first-positive' (default), 'first-negative',
 * 'subsequent'), `level` ('I' (default) to 'IV'), `polarity` ('positive' (default) or 'negative':
 * sign of the current), `delay` [s, default 0]. The value is in amperes.
 * @example create({ stroke: 'first-positive', level: 'I', polarity: 'positive', delay: 0 }).value(19e-6) // 103.4 kA
 */
export const lightningCurrentSource = defineSource({
  type: 'lightning-current',
  summary: 'IEC 62305-1 lightning current (Heidler function) per stroke and protection level, in amperes',
  params: {
    stroke: { kind: 'enum', values: ['first-positive', 'first-negative', 'subsequent'], default: 'first-positive', summary: 'stroke: first positive 10/350 us, first negative 1/200 us, subsequent 0.25/100 us' },
    level: { kind: 'enum', values: ['I', 'II', 'III', 'IV'], default: 'I', summary: 'lightning protection level; sets the peak current' },
    polarity: { kind: 'enum', values: ['positive', 'negative'], default: 'positive', summary: 'sign of the current (the shape is the same)' },
    delay: { unit: 's', default: 0, min: 0, summary: 'time before the stroke starts; the value is 0 before it' },
  },
  create(p) {
    const st = LIGHTNING_STROKES[p.stroke as keyof typeof LIGHTNING_STROKES];
    const scale = LIGHTNING_LEVEL_SCALE[p.level as keyof typeof LIGHTNING_LEVEL_SCALE] * (p.polarity === 'negative' ? -1 : 1);
    // [delay, I/k, tau1, tau2, n]
    const s = new Float64Array([p.delay, (scale * st.peakA) / st.k, st.tau1S, st.tau2S, st.n]);
    return {
      shortestFeatureS: FRONT_S[p.stroke as keyof typeof FRONT_S],
      settledAfterS: p.delay + 40 * st.tau2S,
      value(tS: number): number {
        return s[1] * heidler(tS - s[0], s[2], s[3], s[4]);
      },
    };
  },
});
