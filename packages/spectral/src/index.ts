export { solveSpectrum, solveNetworkSpectrum, spectrumSweep, parseOutputSpec, parsePortSpec, outputName } from './spectrum.ts';
