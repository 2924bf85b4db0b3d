/**
 * @skein/spectral: the frequency-domain solver of a whole network (line blocks from gamma and Zc,
 * junctions and lumped parts as admittance stamps, sources as phasors), its outputs (node voltages,
 * currents, transfer functions, input impedance, S-parameters, Touchstone files) and the time
 * response from the spectrum as a reference for the transient solver.
 */
export {
  solveSpectrum, solveNetworkSpectrum, spectrumSweep, parseOutputSpec, parsePortSpec, outputName,
  type SpectralOutput, type SpectralSeries, type SpectralResults, type SpectralPort, type SParameters, type SpectrumOptions, type SpectrumResult,
} from './spectrum.ts';
export { compileNetwork, nodeIndex, type SpectralNetwork } from './network.ts';
export { toTouchstone, parseTouchstone, type TouchstoneOptions, type TouchstoneData } from './touchstone.ts';
export { timeResponse, fft, type TimeResponseOptions, type TimeResponse, type TimeWindow } from './timeResponse.ts';
export { lineBlock, lineModes, type LineBlock, type LineModes } from './lineBlock.ts';
export { missingHook, notContinuable, singularNetwork, badTouchstone } from './errors.ts';
export { cZeros, cFrom, cIdentity, cMul, cLu, cLuSolve, cInverse, cEigen, csqrt, type CMatrix, type CLu, type CEigen } from './complex.ts';
export { parseSpectrumArgs, spectralSection, formatSpectrumTable, formatTimeTable, runSpectrumCommand, type SpectrumCommand, type TimeResponseCommand } from './command.ts';
