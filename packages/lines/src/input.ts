/**
 * The cross-section input: a plain object (parsed from YAML/JSON, numbers already SI floats),
 * a discriminated union on `kind`. See README.md and {@link sectionSchema} for the full schema.
 */
import type { DielectricInput } from './dielectric.ts';

/** Conductor material: a named metal, a perfect conductor (no loss), or explicit values. */
export type MaterialInput = 'copper' | 'aluminium' | 'perfect' | { conductivity: number; relPermeability?: number };

/** Lossy homogeneous earth. */
export interface EarthInput {
  /** Earth resistivity [ohm*m]. */
  resistivityOhmM: number;
  /** Earth relative permittivity [-]; omitted: Carson's original (no displacement current). */
  relPermittivity?: number;
  /** 'carson' (numerical Carson integral, default) or 'complex-depth' (Deri). */
  model?: 'carson' | 'complex-depth';
}

/** Ground below a wire section. */
export type GroundInput = 'none' | 'perfect' | EarthInput;

/** Insulation around one wire. */
export interface InsulationInput extends DielectricInput {
  /** Radial thickness [m], >= 0. */
  thickness: number;
}

/** Bundled sub-conductors at the corners of a regular polygon. */
export interface BundleSpec {
  /** Number of sub-conductors, >= 2. */
  count: number;
  /** Distance between adjacent sub-conductors [m]. */
  spacing: number;
}

/** One wire of a 'wires' section. */
export interface WireInput {
  /** Conductor name (unique). */
  name: string;
  /** Horizontal position [m]. */
  x: number;
  /** Height of the axis above ground [m] (any vertical position when ground is 'none'). */
  y: number;
  /** Conductor radius (of each sub-conductor for bundles) [m]. */
  radius: number;
  /** Material, default 'copper'. */
  material?: MaterialInput;
  /** Insulation (needs the numerical solver). */
  insulation?: InsulationInput;
  /** Bundled sub-conductors. */
  bundle?: BundleSpec;
}

/** Round wires above ground or in free space. */
export interface WiresSectionInput {
  kind: 'wires';
  ground: GroundInput;
  /** With ground 'none': the name of the wire that is the reference conductor. */
  reference?: string;
  wires: WireInput[];
  /** 'auto' (default: numeric when any wire is insulated, thin-wire otherwise), 'thin-wire', 'numeric'. */
  solver?: 'auto' | 'thin-wire' | 'numeric';
  /** Harmonics per circle for the numerical solver; omitted: chosen automatically (6, 12, 24, 48 until C and L change by < 1e-7, at most 800 unknowns). */
  harmonics?: number;
}

/** Shield of a coax. */
export interface ShieldInput {
  /** Shield thickness [m] (omitted: the shield is a perfect conductor). */
  thickness?: number;
  /** Shield material, default 'copper'. */
  material?: MaterialInput;
}

/** The coax shield as a conductor over ground (second level). */
export interface CoaxOverGroundInput {
  /** Height of the cable axis above ground [m]. */
  height: number;
  /** Ground: 'perfect' or lossy earth. */
  ground: 'perfect' | EarthInput;
  /** Insulating jacket over the shield. */
  jacket?: InsulationInput;
}

/** Coaxial cable. */
export interface CoaxSectionInput {
  kind: 'coax';
  /** Inner conductor radius [m]. */
  innerRadius: number;
  /** Inner radius of the shield [m]. */
  shieldInnerRadius: number;
  /** Dielectric between inner and shield. */
  dielectric: DielectricInput;
  /** Inner conductor material, default 'copper'. */
  innerMaterial?: MaterialInput;
  shield?: ShieldInput;
  overGround?: CoaxOverGroundInput;
}

/** Microstrip. */
export interface MicrostripSectionInput {
  kind: 'microstrip';
  /** Strip width [m]. */
  width: number;
  /** Substrate height [m]. */
  substrateHeight: number;
  /** Strip thickness [m] (needed for conductor loss unless material is 'perfect'). */
  thickness?: number;
  substrate: DielectricInput;
  /** Strip and ground material, default 'copper'. */
  material?: MaterialInput;
}

/** Stripline (centred strip) or edge-coupled stripline pair. */
export interface StriplineSectionInput {
  kind: 'stripline' | 'coupled-stripline';
  /** Strip width [m] (each strip for the coupled pair). */
  width: number;
  /** Edge-to-edge gap [m] (coupled pair only). */
  gap?: number;
  /** Spacing between the two ground planes [m]. */
  plateSpacing: number;
  /** Strip thickness [m], used for conductor loss only (the impedance is Cohn's zero-thickness result). */
  thickness?: number;
  dielectric: DielectricInput;
  material?: MaterialInput;
}

/** Any cross-section. */
export type SectionInput = WiresSectionInput | CoaxSectionInput | MicrostripSectionInput | StriplineSectionInput;
