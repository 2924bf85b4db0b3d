/**
 * The standard plugin set, in the fixed order every thread loads it. Core names none of these;
 * they are ordinary plugin packages written against core's public API.
 */
export const STANDARD_PLUGINS: readonly string[] = [
  '@skein/plugin-waveforms',
  '@skein/plugin-loads',
  '@skein/plugin-probes',
  '@skein/plugin-surge-waveforms',
  '@skein/plugin-devices',
];

/** The URL the standard specifiers resolve from (this package depends on each of them). */
export const STANDARD_PLUGINS_BASE: string = import.meta.url;
