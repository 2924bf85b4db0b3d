/**
 * Physical constants in SI units (CODATA 2018 values; mu0 is the measured value, not 4 pi 1e-7).
 *
 * @example
 * C0 * Math.sqrt(MU0 * EPS0); // ≈ 1
 */

/** Speed of light in vacuum [m/s] (exact). */
export const C0 = 299_792_458;
/** Vacuum permeability [H/m] (CODATA 2018). */
export const MU0 = 1.25663706212e-6;
/** Vacuum permittivity [F/m] (CODATA 2018). */
export const EPS0 = 8.8541878128e-12;
/** Impedance of free space sqrt(mu0/eps0) [ohm]. */
export const ETA0 = Math.sqrt(MU0 / EPS0);

/** Conductivity of annealed copper [S/m] (the value REFERENCES.md uses). */
export const COPPER_CONDUCTIVITY = 5.8e7;
/** Conductivity of hard-drawn aluminium, resistivity 2.65e-8 ohm*m at 20 °C [S/m] (CRC Handbook, from memory). */
export const ALUMINIUM_CONDUCTIVITY = 1 / 2.65e-8;
