/**
 * @skein/lines: per-unit-length R, L, G, C matrices of transmission-line cross-sections.
 * Usable on its own; imports nothing from the rest of skein.
 */
export { computeSection, DC_EARTH_INDUCTANCE_HZ } from './section.ts';
export type { LineSection, Rlgc, ZY } from './section.ts';
export { SectionError, sectionError, formatPath } from './errors.ts';
export type { SectionErrorCode, SectionPath } from './errors.ts';
export { sectionSchema } from './schema.ts';
export type { JsonSchema } from './schema.ts';
export type {
  SectionInput,
  WiresSectionInput,
  WireInput,
  CoaxSectionInput,
  CoaxOverGroundInput,
  ShieldInput,
  MicrostripSectionInput,
  StriplineSectionInput,
  GroundInput,
  EarthInput,
  InsulationInput,
  BundleSpec,
  MaterialInput,
} from './input.ts';
export { C0, MU0, EPS0, ETA0, COPPER_CONDUCTIVITY, ALUMINIUM_CONDUCTIVITY } from './constants.ts';
export type { Complex } from './complex.ts';
export { besselJ0, besselJ1, besselJ0Scaled, besselJ1Scaled, besselJ0OverJ1 } from './bessel.ts';
export { skinDepth, roundWireInternalImpedance, roundWireInternalImpedanceS, roundWireDcInternalInductance, slabImpedance, slabImpedanceS } from './skin.ts';
export type { SlabImpedance } from './skin.ts';
export { carsonEarthImpedance, carsonEarthImpedanceS, complexDepthEarthImpedance, complexDepthEarthImpedanceS } from './earth.ts';
export type { EarthParams } from './earth.ts';
export { coax, twoWire, wireOverGround, imageMethodWires, invertSymmetric } from './closedForms.ts';
export type { TwoConductorLine, ImageWire, ImageMethodResult } from './closedForms.ts';
export { microstrip, stripline, coupledStripline, ellipticK } from './printed.ts';
export type { PrintedLine, CoupledPair } from './printed.ts';
export { solveInsulatedBundle } from './bundleSolver.ts';
export type { BundleInput, BundleWire, BundleResult } from './bundleSolver.ts';
export { constantDielectric, djordjevicSarkarDielectric, dielectricModel } from './dielectric.ts';
export type { DielectricInput, DielectricModel } from './dielectric.ts';
export { integrateComplex } from './quadrature.ts';
export { sampleSection } from './sample.ts';
export type { SampledRlgc } from './sample.ts';
