/**
 * @skein/report: SVG plots (probe waveforms, space-time voltage map, energy ledger, spectra) and
 * the self-contained HTML report of a skein results file. Rendering is headless: Observable Plot
 * draws into linkedom's DOM in Node; no browser is needed to make the SVG.
 */
export { plotTraces, defaultTraceNames, type TracePlotOptions } from './traces.ts';
export { plotSpaceTime, spaceTimeData, hasSpaceTime, resampleMap, type SpaceTimeOptions, type SpaceTimeMap } from './spaceTime.ts';
export { plotLedger, ledgerRows, hasLedger, LEDGER_TERMS, type LedgerPlotOptions, type LedgerRow } from './ledger.ts';
export { plotSpectrum, spectralOf, type SpectrumPlotOptions, type SpectralResults, type SpectralSeries } from './spectrum.ts';
export { renderReport, makePlots, SAFETY_CAUTION, type ReportOptions, type ReportPlots, type MalformedPolicy } from './report.ts';
export { writePlots, writeReport, type WritePlotsOptions, type WrittenPlot } from './write.ts';
export { cividis, cividisRgb, CIVIDIS_RGB, TRACE_PALETTE, TRACE_DASHES } from './colormap.ts';
export { prefixExponent, prefixedUnit, formatTick, formatTickOwnPrefix, axisTickFormat, axisLabel } from './engineering.ts';
export { encodePng, crc32 } from './png.ts';
