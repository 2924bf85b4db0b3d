/**
 * Edge shapes shared by the waveforms: the fraction 0..1 reached a time `tau` into an edge of
 * duration `rise`. Pure functions of numbers; they allocate nothing.
 */

/** Linear edge: tau / rise, clamped to [0, 1]. */
export function linearEdge(tauS: number, riseS: number): number {
  if (tauS <= 0) return 0;
  if (tauS >= riseS) return 1;
  return tauS / riseS;
}

/**
 * Raised-cosine edge (0.5 (1 - cos(pi tau / rise))), clamped to [0, 1]: continuous slope at both
 * ends, so its spectrum falls faster than a linear edge's (common practice).
 */
export function smoothEdge(tauS: number, riseS: number): number {
  if (tauS <= 0) return 0;
  if (tauS >= riseS) return 1;
  return 0.5 * (1 - Math.cos((Math.PI * tauS) / riseS));
}

/** Amplitude parameter spec shared by every waveform (in the drive's unit). */
export const AMPLITUDE = {
  unit: '1',
  default: 1,
  summary: 'peak value in the drive unit: volts for a voltage drive, amperes for a current drive (a plain number)',
} as const;

/** Delay parameter spec shared by the waveforms. */
export const DELAY = { unit: 's', default: 0, min: 0, summary: 'time before the waveform starts; the value is 0 before it' } as const;
