/**
 * The errors of the spectral package, each from a named factory with a stable code. Bad input
 * (nodes, outputs, ports, sweep settings) uses core's `badInput` with E_SPECTRAL_* codes.
 */
import { NumericalError, SkeinError } from '@skein/core';

/**
 * A plugin lacks a frequency-domain hook a spectral run needs (STYLE: capabilities are the hooks present).
 * @example missingHook('resistor', 'admittance', 'RL', 'load').code // 'E_SPECTRAL_HOOK_MISSING'
 */
export function missingHook(plugin: string, hook: 'admittance' | 'admittanceAt' | 'laplace', part: string, kind: 'load' | 'waveform'): SkeinError {
  const what = hook === 'admittance'
    ? 'a spectral run needs admittance(omegaRadS, out) or admittanceAt(sigma, omegaRadS, out) on every load'
    : hook === 'admittanceAt'
      ? "the numerical Laplace transform (method 'laplace') evaluates every load at s = sigma + j omega and needs admittanceAt(sigma, omegaRadS, out)"
      : "excitation 'waveform' needs laplace(sigma, omega, out) on every source";
  return new SkeinError('E_SPECTRAL_HOOK_MISSING', `part ${part}: ${kind} plugin ${plugin} has no frequency-domain hook "${hook}"; ${what}`, { plugin, hook, part });
}

/**
 * The nodal system is singular at one frequency.
 * @param where the node or row where elimination found no pivot.
 */
export function singularNetwork(frequencyHz: number, where: string, row: number): NumericalError {
  return new NumericalError('E_SPECTRAL_SINGULAR', `the network's nodal system is singular at ${frequencyHz.toPrecision(6)} Hz near ${where}; every node needs a path to the reference`, { frequencyHz, row });
}

/**
 * An element of the network cannot be evaluated at complex frequency s = sigma + j omega.
 * @param what the element ("line feeder"); @param why what is missing or not continuable.
 * @example notContinuable('line c1', 'constant loss tangent').code // 'E_SPECTRAL_COMPLEX_FREQUENCY'
 */
export function notContinuable(what: string, why: string): SkeinError {
  return new SkeinError('E_SPECTRAL_COMPLEX_FREQUENCY', `${what} cannot be evaluated at complex frequency s = sigma + j omega, which the numerical Laplace transform (method 'laplace') needs: ${why}; use method 'fourier' for this network`, { element: what, reason: why });
}

/** A Touchstone file that cannot be read. */
export function badTouchstone(line: number, why: string): SkeinError {
  return new SkeinError('E_TOUCHSTONE', `Touchstone line ${line}: ${why}`, { line });
}

/** A broken invariant: a bug in skein. */
export function spectralBug(message: string): SkeinError {
  return new SkeinError('E_BUG', `bug: ${message}`);
}

/** A complex matrix has no pivot in a column (caught and re-raised with context by the network solver). */
export function singularMatrix(row: number): SkeinError {
  return new SkeinError('E_SINGULAR', `matrix is singular (no pivot in column ${row})`, { row });
}

/** The QR iteration of cEigen did not converge. */
export function eigenNoConvergence(n: number): NumericalError {
  return new NumericalError('E_EIGEN_NO_CONVERGENCE', `complex eigen-decomposition of a ${n}x${n} matrix did not converge`, { n });
}
