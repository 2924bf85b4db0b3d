/**
 * Frequency-dependent multiconductor lines by a constant real modal transformation (route (a) of
 * ./fdLine.ts's header).
 *
 * With V = Tv Vm and I = Ti Im, Ti = Tv^-T, the telegrapher's equations dV/dz = -Z I,
 * dI/dz = -Y V become dVm/dz = -Zm Im, dIm/dz = -Ym Vm with
 *
 *   Zm = Tv^-1 Z Ti,   Ym = Ti^-1 Y Tv,   Zm Ym = Tv^-1 (Z Y) Tv.
 *
 * For a line whose modes do not depend on frequency (a symmetric pair: even and odd modes; any
 * homogeneous line) one real Tv makes Zm and Ym diagonal at every frequency and the modes are
 * exactly independent single-mode lines (C. R. Paul, Analysis of Multiconductor Transmission Lines,
 * 2nd ed., Wiley 2008, modal decoupling of lossy lines, from memory). In general (earth return,
 * unequal wires) the eigenvectors of Z Y turn with frequency. The constant-T model (J. R. Marti,
 * IEEE Trans. PAS-101(1), 1982; from memory) keeps one real Tv0 for all frequencies, chosen at a
 * frequency f0 that represents the transient, keeps the diagonals zm_k(omega), ym_k(omega) of Zm
 * and Ym and neglects their off-diagonal terms. Each mode k is then a single-mode line
 * (gamma_k = sqrt(zm_k ym_k), Yc_k = sqrt(ym_k / zm_k)) fitted and stepped as in ./fdLine.ts.
 *
 * Tv0 here: the lossless decomposition (./modal.ts: Cholesky of C, symmetric eigenproblem) of the
 * effective matrices L(f0) = Im Z(f0) / omega0 and C(f0) = Im Y(f0) / omega0 of the section at f0,
 * which is real, has Ti0 = Tv0^-T exactly, and for lines with low loss at f0 (omega L >> R) is the
 * real part of the exact eigenvectors to first order in R / (omega L).
 *
 * How far the true modes depart from Tv0 is measured by the neglected coupling: with
 * M(omega) = Tv0^-1 Z Y Tv0, the coupling of modes i and j is
 *
 *   c_ij(omega) = sqrt(|M_ij M_ji| / |M_ii M_jj|),
 *
 * independent of how each mode is scaled; zero where Tv0 diagonalises Z Y exactly. Neglecting
 * M_ij perturbs gamma_i^2 to first order by the fraction c_ij (a 2 x 2 block [[a, e], [e, a]] has
 * eigenvalues a (1 +- e / a)), so c = 0.01 is a phase error of about 0.5 % of gamma l. The report
 * gives the largest c over the band the modes were fitted on (where some mode has |H| >= hFloor).
 */
import type { LineSection, Rlgc, ZY } from '@skein/lines';
import { badInput } from '../errors.ts';
import { fitFdLine, type FdLineFitOptions, type FdLineModel } from './fdLine.ts';
import { decomposeLine } from './modal.ts';

/** A constant real modal transformation, n x n row-major: V = Tv Vm, I = Ti Im, Ti = Tv^-T. */
export interface ModalTransform {
  n: number;
  /** Frequency the transformation was computed at [Hz]. */
  fHz: number;
  Tv: Float64Array;
  TvInv: Float64Array;
  Ti: Float64Array;
  TiInv: Float64Array;
}

/** How far the line's true modes depart from a constant transformation over a band. */
export interface ModalCoupling {
  /** Largest neglected coupling c_ij over the band (header of this file). */
  max: number;
  /** Frequency of the largest coupling [Hz]. */
  atHz: number;
  /** The modes (1-based) it couples. */
  modes: [number, number];
  /** Band the coupling was measured over [Hz]. */
  bandHz: [number, number];
}

/** A fitted multiconductor frequency-dependent line: the transformation and one model per mode. */
export interface FdMultiModel {
  n: number;
  lengthM: number;
  transform: ModalTransform;
  /** One fitted single-mode model per mode, in the order of the transformation's columns. */
  modes: FdLineModel[];
  /** The neglected modal coupling (0 for one conductor). */
  coupling: ModalCoupling;
}

/**
 * The default frequency of the modal transformation: the quarter-wave frequency 1 / (4 tau) of the
 * line's slowest lossless mode, the natural frequency of a line switched onto a stiff source at one
 * end and open at the other, which dominates switching transients (common practice).
 * @param section the section from @skein/lines
 * @param lengthM line length [m]
 * @returns f0 [Hz]
 * @example defaultModalFrequency(pair, 1000) // about 75 kHz for a line at light speed
 */
export function defaultModalFrequency(section: LineSection, lengthM: number): number {
  const ml = decomposeLine(section.L, section.C);
  let vmin = Infinity;
  for (const v of ml.velocities) vmin = Math.min(vmin, v);
  return vmin / (4 * lengthM);
}

/**
 * The constant real transformation of a section at f0 (this file's header).
 * @param section the section from @skein/lines
 * @param fHz f0 [Hz], > 0
 * @returns Tv, Tv^-1, Ti, Ti^-1 with modes ordered fastest first
 * @throws InputError (E_INPUT) for f0 <= 0
 * @example constantModalTransform(pair, 1e6).Tv // [1, 1, 1, -1] for a symmetric pair
 */
export function constantModalTransform(section: LineSection, fHz: number): ModalTransform {
  if (!(fHz > 0) || !Number.isFinite(fHz)) throw badInput(['fdLine', 'modalFrequency'], 'must be a positive frequency', `${fHz} Hz`);
  const n = section.n;
  const w = 2 * Math.PI * fHz;
  const zy = section.zyAt(fHz);
  const L = new Float64Array(n * n);
  const C = new Float64Array(n * n);
  for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) {
    L[a * n + b] = (zy.Zim[a * n + b] + zy.Zim[b * n + a]) / (2 * w);
    C[a * n + b] = (zy.Yim[a * n + b] + zy.Yim[b * n + a]) / (2 * w);
  }
  const ml = decomposeLine(L, C);
  return { n, fHz, Tv: ml.Tv, TvInv: ml.TvInv, Ti: ml.Ti, TiInv: ml.TiInv };
}

/** Diagonal entry k of A X B for n x n row-major real A, B and complex X (re, im). */
function diagOf(n: number, A: Float64Array, xr: Float64Array, xi: Float64Array, B: Float64Array, k: number): [number, number] {
  let sr = 0, si = 0;
  for (let a = 0; a < n; a++) {
    const ak = A[k * n + a];
    if (ak === 0) continue;
    for (let b = 0; b < n; b++) {
      const c = ak * B[b * n + k];
      sr += c * xr[a * n + b];
      si += c * xi[a * n + b];
    }
  }
  return [sr, si];
}

/** Z and Y of a section at f, computed once per frequency and shared by its modes. */
function cachedZy(section: LineSection): (fHz: number) => ZY {
  const cache = new Map<number, ZY>();
  return (fHz) => {
    let zy = cache.get(fHz);
    if (!zy) {
      zy = section.zyAt(fHz);
      cache.set(fHz, zy);
    }
    return zy;
  };
}

/**
 * Mode k of a section under a constant transformation, as a one-conductor section: its Z and Y are
 * the diagonals zm_k, ym_k of Zm and Ym, its high-frequency L and C those of the section's.
 * @param section the multiconductor section
 * @param t the transformation
 * @param k mode index (0-based)
 * @param zyAt Z and Y of the section at f (default: the section's own)
 * @returns a one-conductor LineSection
 * @example modeSection(pair, constantModalTransform(pair, 1e6), 1).L[0] // odd-mode inductance [H/m]
 */
export function modeSection(section: LineSection, t: ModalTransform, k: number, zyAt: (fHz: number) => ZY = (f) => section.zyAt(f)): LineSection {
  const n = section.n;
  const zero = new Float64Array(n * n);
  const Lm = diagOf(n, t.TvInv, section.L, zero, t.Ti, k)[0];
  const Cm = diagOf(n, t.TiInv, section.C, zero, t.Tv, k)[0];
  const modeZy = (fHz: number): ZY => {
    const zy = zyAt(fHz);
    const [zr, zi] = diagOf(n, t.TvInv, zy.Zre, zy.Zim, t.Ti, k);
    const [yr, yi] = diagOf(n, t.TiInv, zy.Yre, zy.Yim, t.Tv, k);
    return { Zre: Float64Array.of(zr), Zim: Float64Array.of(zi), Yre: Float64Array.of(yr), Yim: Float64Array.of(yi) };
  };
  return {
    conductors: [`mode${k + 1}`], n: 1, L: Float64Array.of(Lm), C: Float64Array.of(Cm),
    zyAt: modeZy,
    rlgcAt: (fHz: number): Rlgc => {
      const zy = modeZy(fHz);
      const w = 2 * Math.PI * fHz;
      return fHz > 0
        ? { R: zy.Zre, L: Float64Array.of(zy.Zim[0] / w), G: zy.Yre, C: Float64Array.of(zy.Yim[0] / w) }
        : { R: zy.Zre, L: Float64Array.of(Lm), G: zy.Yre, C: Float64Array.of(Cm) };
    },
    describe: `mode ${k + 1} of ${section.describe} (constant transformation at ${t.fHz} Hz)`,
  };
}

/**
 * The neglected coupling of a constant transformation over frequencies (this file's header).
 * @param section the section
 * @param t the transformation
 * @param fHz frequencies [Hz], > 0
 * @param zyAt Z and Y of the section at f (default: the section's own)
 * @returns the largest coupling, where and between which modes
 * @example modalCoupling(pair, constantModalTransform(pair, 1e6), [1e3, 1e6, 1e9]).max // ~1e-16
 */
export function modalCoupling(section: LineSection, t: ModalTransform, fHz: ArrayLike<number>, zyAt: (fHz: number) => ZY = (f) => section.zyAt(f)): ModalCoupling {
  const n = section.n;
  const out: ModalCoupling = { max: 0, atHz: fHz[0] ?? 0, modes: [1, Math.min(2, n)], bandHz: [fHz[0] ?? 0, fHz[fHz.length - 1] ?? 0] };
  if (n < 2) return out;
  const pr = new Float64Array(n * n), pi = new Float64Array(n * n);
  const mr = new Float64Array(n * n), mi = new Float64Array(n * n);
  for (let q = 0; q < fHz.length; q++) {
    const zy = zyAt(fHz[q]);
    // P = Z Y (complex), then M = Tv^-1 P Tv.
    for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) {
      let sr = 0, si = 0;
      for (let c = 0; c < n; c++) {
        const zr = zy.Zre[a * n + c], zi = zy.Zim[a * n + c], yr = zy.Yre[c * n + b], yi = zy.Yim[c * n + b];
        sr += zr * yr - zi * yi;
        si += zr * yi + zi * yr;
      }
      pr[a * n + b] = sr;
      pi[a * n + b] = si;
    }
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
      let sr = 0, si = 0;
      for (let a = 0; a < n; a++) {
        const ta = t.TvInv[i * n + a];
        for (let b = 0; b < n; b++) {
          const c = ta * t.Tv[b * n + j];
          sr += c * pr[a * n + b];
          si += c * pi[a * n + b];
        }
      }
      mr[i * n + j] = sr;
      mi[i * n + j] = si;
    }
    for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) {
      const c = Math.sqrt((Math.hypot(mr[i * n + j], mi[i * n + j]) * Math.hypot(mr[j * n + i], mi[j * n + i])) /
        (Math.hypot(mr[i * n + i], mi[i * n + i]) * Math.hypot(mr[j * n + j], mi[j * n + j])));
      if (c > out.max) {
        out.max = c;
        out.atHz = fHz[q];
        out.modes = [i + 1, j + 1];
      }
    }
  }
  return out;
}

/**
 * The neglected coupling of a constant transformation over a band, on a logarithmic grid.
 * @param section the section
 * @param t the transformation
 * @param fLoHz lowest frequency [Hz], > 0
 * @param fHiHz highest frequency [Hz], >= fLoHz
 * @param perDecade grid points per decade; default 10
 * @param zyAt Z and Y of the section at f (default: the section's own)
 * @returns the largest coupling, where and between which modes
 * @example couplingOverBand(pair, constantModalTransform(pair, 1e6), 1e3, 1e9).max // ~1e-16
 */
export function couplingOverBand(section: LineSection, t: ModalTransform, fLoHz: number, fHiHz: number, perDecade = 10, zyAt?: (fHz: number) => ZY): ModalCoupling {
  const nF = Math.max(8, Math.ceil(Math.log10(fHiHz / fLoHz) * perDecade) + 1);
  const fs = Float64Array.from({ length: nF }, (_, i) => fLoHz * (fHiHz / fLoHz) ** (i / (nF - 1)));
  return modalCoupling(section, t, fs, zyAt);
}

/** Options of fitFdMultiLine: the single-mode fit options and the transformation's frequency. */
export interface FdMultiFitOptions extends FdLineFitOptions {
  /** Frequency of the constant transformation [Hz]; default `defaultModalFrequency`. */
  modalFrequencyHz?: number;
}

/**
 * Fits a multiconductor frequency-dependent line by a constant real transformation: each mode's
 * delay, Yc and H' by ./fdLine.ts (passivity enforced per mode), and the neglected coupling over
 * the fitted band. A one-conductor section is fitted directly (transformation 1, coupling 0).
 * @param section the section from @skein/lines
 * @param lengthM line length [m]
 * @param options single-mode fit options and modalFrequencyHz (default: quarter-wave frequency)
 * @returns the transformation, one model per mode and the coupling measure
 * @throws InputError (E_INPUT) as fitFdLine does, or for a non-positive modal frequency
 * @example fitFdMultiLine(pair, 100).modes.length // 2
 */
export function fitFdMultiLine(section: LineSection, lengthM: number, options: FdMultiFitOptions = {}): FdMultiModel {
  const n = section.n;
  if (n === 1) {
    const one = Float64Array.of(1);
    const model = fitFdLine(section, lengthM, options);
    return {
      n, lengthM, modes: [model],
      transform: { n, fHz: options.modalFrequencyHz ?? 0, Tv: one, TvInv: one.slice(), Ti: one.slice(), TiInv: one.slice() },
      coupling: { max: 0, atHz: 0, modes: [1, 1], bandHz: model.bands.h },
    };
  }
  const f0 = options.modalFrequencyHz ?? defaultModalFrequency(section, lengthM);
  const t = constantModalTransform(section, f0);
  const zyAt = cachedZy(section);
  const modes: FdLineModel[] = [];
  for (let k = 0; k < n; k++) modes.push(fitFdLine(modeSection(section, t, k, zyAt), lengthM, options));
  let fTop = 0;
  for (const m of modes) fTop = Math.max(fTop, m.bands.h[1]);
  return { n, lengthM, transform: t, modes, coupling: couplingOverBand(section, t, options.fMinHz ?? 1, fTop, 10, zyAt) };
}
