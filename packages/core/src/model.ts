/**
 * The resolved network: what a scenario means after validation, with every number in SI units,
 * every name turned into an index and every plugin parameter checked. The compile step turns it
 * into flat arrays; nothing after this point looks up a name.
 */
import type { LineSection } from '@skein/lines';
import type { DocPath, SourceLocation } from './errors.ts';

/** Time settings of a run. */
export interface ResolvedTime {
  /** End of the simulated interval [s]. */
  endS: number;
  /** Time step chosen by the user [s]; undefined means automatic. */
  stepS: number | undefined;
  /** Automatic step: steps across the fastest source feature (default 10). */
  stepsPerFeature: number;
  /** Record every k-th step (default 1). */
  recordEvery: number;
  /** How a delay that is not a whole number of steps is handled. */
  delays: 'interpolate' | 'round';
}

/** One uniform stretch of a line whose parameters vary along it. Matrices n x n, row-major, per metre. */
export interface ResolvedStretch {
  lengthM: number;
  L: Float64Array;
  C: Float64Array;
  R: Float64Array;
  G: Float64Array;
  /** Where the stretch sits in the scenario document. */
  path: DocPath;
}

/**
 * A smooth taper of a one-conductor line's characteristic impedance from Z_from (z = 0) to Z_to
 * (z = length) at a constant velocity v: exponential, Z(z) = Z_from (Z_to / Z_from)^(z / length),
 * or linear, Z(z) = Z_from + (Z_to - Z_from) z / length. Then L(z) = Z(z) / v, C(z) = 1 / (Z(z) v).
 */
export interface ResolvedTaper {
  fromOhm: number;
  toOhm: number;
  velocityMps: number;
  shape: 'exponential' | 'linear';
}

/**
 * How a line's per-unit-length parameters vary along it (stepped by an FDTD segment only):
 * consecutive uniform stretches from z = 0, or a taper with constant R and G (ResolvedLine.R, G).
 */
export type ResolvedProfile = { kind: 'stretches'; stretches: ResolvedStretch[] } | { kind: 'taper'; taper: ResolvedTaper };

/**
 * A multiconductor line. Matrices are n x n, row-major, per metre. Uniform unless it has a
 * profile; a line with a profile carries here the parameters at its from end (z = 0).
 */
export interface ResolvedLine {
  id: string;
  index: number;
  /** Junction index at z = 0 and at z = length. */
  from: number;
  to: number;
  lengthM: number;
  conductors: string[];
  /** Inductance [H/m] and capacitance [F/m], symmetric positive definite. */
  L: Float64Array;
  C: Float64Array;
  /** Constant resistance [ohm/m] and conductance [S/m] given in the scenario; zero when absent. */
  R: Float64Array;
  G: Float64Array;
  /**
   * Frequency-dependent parameters when the line was given by a cross-section (R(f), L(f), G(f),
   * C(f), Z and Y); L and C above are then its high-frequency values.
   */
  section?: LineSection;
  /**
   * Cells of the FDTD (leapfrog) segment that steps this line, when it has losses (R or G) or asks
   * for one (`fdtd: { cells }`); undefined for travelling-wave (method of characteristics) lines.
   */
  fdtdCells?: number;
  /** Parameters varying along the line (`stretches` or `taper` in the scenario); the line is then stepped by FDTD. */
  profile?: ResolvedProfile;
  /**
   * True for a line given by a section and stepped by the frequency-dependent travelling-wave
   * model (`model: frequency-dependent`): vector-fitted Yc and propagation function per mode,
   * multiconductor lines under a constant real modal transformation (line/fdModal.ts).
   */
  frequencyDependent?: boolean;
  /**
   * Frequency of the constant modal transformation of a multiconductor frequency-dependent line
   * (`modalFrequency`) [Hz]; undefined: the quarter-wave frequency of its slowest mode.
   */
  fdModalFrequencyHz?: number;
  /** The section as written in the scenario (kept for the digest and reports). */
  sectionInput?: unknown;
  /** Where the line sits in the scenario document. */
  path: DocPath;
  /** How the matrices were obtained, for reports. */
  origin: string;
}

/** A line-end conductor wired to a junction node. */
export interface ResolvedPort {
  line: number;
  end: 0 | 1;
  conductor: number;
  node: number;
}

/** A lumped part between two nodes of a junction (node -1 is the reference). */
export interface ResolvedPart {
  id: string;
  junction: number;
  role: 'source' | 'load';
  /** Plugin type name. */
  type: string;
  plus: number;
  minus: number;
  /** Plugin parameters in SI units. */
  params: Record<string, unknown>;
  /** Sources only: what the waveform drives. */
  drive: 'voltage' | 'current';
  /** Sources only: series resistance of a voltage drive, parallel of a current drive [ohm] (Infinity: none). */
  resistanceOhm: number;
  path: DocPath;
}

/** A junction: nodes, the line-end conductors on them, and lumped parts. */
export interface ResolvedJunction {
  id: string;
  index: number;
  nodes: string[];
  ports: ResolvedPort[];
  parts: ResolvedPart[];
  path: DocPath;
}

/** A probe: plugin type and its parameters. */
export interface ResolvedProbe {
  id: string;
  type: string;
  params: Record<string, unknown>;
  path: DocPath;
}

/** A whole scenario after validation. */
export interface ResolvedScenario {
  title: string;
  file: string | undefined;
  time: ResolvedTime;
  lines: ResolvedLine[];
  junctions: ResolvedJunction[];
  probes: ResolvedProbe[];
  /** SHA-256 of the canonical resolved content (hex). */
  digest: string;
  /** File, line and column of a path in the scenario document (for errors found after resolution). */
  locate: (path: DocPath) => SourceLocation;
}
