/**
 * Tabulates a section's per-unit-length matrices on a frequency grid, in flat buffers ready for
 * the frequency-domain solver and for rational fitting (one allocation per matrix kind).
 */
import type { LineSection } from './section.ts';

/** Matrices on a frequency grid: entry (k, i, j) at offset k*n*n + i*n + j (frequency-major). */
export interface SampledRlgc {
  /** The frequencies [Hz]. */
  fHz: Float64Array;
  /** Conductors per matrix side. */
  n: number;
  /** Resistance [ohm/m], nf*n*n. */
  R: Float64Array;
  /** Inductance [H/m], nf*n*n. */
  L: Float64Array;
  /** Conductance [S/m], nf*n*n. */
  G: Float64Array;
  /** Capacitance [F/m], nf*n*n. */
  C: Float64Array;
}

/**
 * Samples rlgcAt on a frequency grid.
 *
 * @param section a LineSection from computeSection
 * @param fHz frequencies [Hz], each finite and >= 0
 * @returns flat frequency-major buffers (offset k*n*n + i*n + j)
 * @throws SectionError (SECTION_FREQUENCY) for a negative or non-finite frequency
 * @example sampleSection(computeSection(input), [0, 50, 1e3]).R.length // 3 * n * n
 */
export function sampleSection(section: LineSection, fHz: ArrayLike<number>): SampledRlgc {
  const n = section.n;
  const nf = fHz.length;
  const nn = n * n;
  const out: SampledRlgc = {
    fHz: Float64Array.from(fHz),
    n,
    R: new Float64Array(nf * nn),
    L: new Float64Array(nf * nn),
    G: new Float64Array(nf * nn),
    C: new Float64Array(nf * nn),
  };
  for (let k = 0; k < nf; k++) {
    const r = section.rlgcAt(fHz[k]);
    out.R.set(r.R, k * nn);
    out.L.set(r.L, k * nn);
    out.G.set(r.G, k * nn);
    out.C.set(r.C, k * nn);
  }
  return out;
}
