/**
 * What a command line needs: argument parsing for a spectrum run, the results-file section and a
 * plain-text table. The CLI package wires these to `skein spectrum`; nothing here touches files.
 */
import { badInput, parseQuantity, type PluginRegistry, type ResolvedScenario } from '@skein/core';
import { outputName, parseOutputSpec, parsePortSpec, solveSpectrum, spectrumSweep, type SpectralOutput, type SpectralPort, type SpectralResults, type SpectrumResult } from './spectrum.ts';
import { toTouchstone, type TouchstoneOptions } from './touchstone.ts';
import { timeResponse, type TimeResponse } from './timeResponse.ts';

/** The time-response part of a spectrum command (`--until`, `--every`, `--inversion`, ...). */
export interface TimeResponseCommand {
  /** Last sample time [s]; samples at 0, every, 2 every, ... up to it. */
  untilS: number;
  /** Sample interval [s]. */
  everyS: number;
  /** 'fourier' (j omega axis, period doubling) or 'laplace' (numerical Laplace transform). */
  inversion: 'fourier' | 'laplace';
  /** Method 'laplace': the wanted aliasing error relative to the largest |response|. */
  aliasing?: number;
  /** Highest frequency of the series [Hz] (default: from the sources). */
  maxFrequencyHz?: number;
}

/** A parsed `spectrum` command. */
export interface SpectrumCommand {
  /** The scenario file (first positional argument). */
  scenarioFile: string;
  frequenciesHz: number[];
  outputs: SpectralOutput[];
  ports: Array<Required<SpectralPort>>;
  /** File to write Touchstone data into (needs ports), if any. */
  touchstoneFile?: string;
  touchstone: TouchstoneOptions;
  excitation: 'unit' | 'waveform';
  /** With --until: a time response instead of a sweep (frequenciesHz is then empty). */
  time?: TimeResponseCommand;
}

/**
 * Parses `scenario.yaml --from 1kHz --to 1GHz --points 401 [--log] [--out v(J.n)]... [--port J.n[:50ohm]]...
 * [--touchstone file.s2p] [--touchstone-version 1|2] [--format RI|MA|DB] [--excitation unit|waveform]`,
 * or for a time response from the spectrum `scenario.yaml --until 200us --every 2us [--inversion
 * fourier|laplace] [--aliasing 1e-10] [--fmax 4MHz] [--out v(J.n) | i(line.end)]...`.
 * Defaults: --points 201, logarithmic spacing only with --log, Touchstone version 1 for a file
 * named `.sNp` and version 2 otherwise unless --touchstone-version says, format RI, excitation unit.
 * @param args the arguments after the command name.
 * @throws InputError E_SPECTRAL_ARGS naming the option, what was found and what is accepted.
 * @example parseSpectrumArgs(['a.yaml', '--from', '1kHz', '--to', '1GHz', '--points', '401', '--log'])
 */
export function parseSpectrumArgs(args: readonly string[]): SpectrumCommand {
  let file: string | undefined;
  let from: number | undefined;
  let to: number | undefined;
  let points = 201;
  let log = false;
  const outputs: SpectralOutput[] = [];
  const ports: Array<Required<SpectralPort>> = [];
  let touchstoneFile: string | undefined;
  const touchstone: TouchstoneOptions = {};
  let excitation: 'unit' | 'waveform' = 'unit';
  let untilS: number | undefined;
  let everyS: number | undefined;
  let inversion: 'fourier' | 'laplace' | undefined;
  let aliasing: number | undefined;
  let fmax: number | undefined;
  const quantity = (i: number, name: string, unit: 's' | 'Hz', what: string): number => {
    const v = need(i, name);
    const q = parseQuantity(v, unit);
    if (q === undefined || !(q > 0)) throw badInput([name], `must be ${what}`, v, 'E_SPECTRAL_ARGS');
    return q;
  };
  const need = (i: number, name: string): string => {
    const v = args[i + 1];
    if (v === undefined || v.startsWith('--')) throw badInput([name], 'needs a value', v, 'E_SPECTRAL_ARGS');
    return v;
  };
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    switch (a) {
      case '--from': case '--to': {
        const v = need(i, a);
        const f = parseQuantity(v, 'Hz');
        if (f === undefined) throw badInput([a], 'must be a frequency such as 1kHz or 2.5e9', v, 'E_SPECTRAL_ARGS');
        if (a === '--from') from = f; else to = f;
        i++;
        break;
      }
      case '--points': {
        const v = need(i, a);
        points = Number(v);
        if (!Number.isInteger(points) || points < 1) throw badInput([a], 'must be a whole number of at least 1', v, 'E_SPECTRAL_ARGS');
        i++;
        break;
      }
      case '--log': log = true; break;
      case '--out': outputs.push(parseOutputSpec(need(i, a), [a])); i++; break;
      case '--port': ports.push(parsePortSpec(need(i, a), [a])); i++; break;
      case '--touchstone': touchstoneFile = need(i, a); i++; break;
      case '--touchstone-version': {
        const v = need(i, a);
        if (v !== '1' && v !== '2') throw badInput([a], 'must be 1 or 2', v, 'E_SPECTRAL_ARGS');
        touchstone.version = v === '1' ? 1 : 2;
        i++;
        break;
      }
      case '--format': {
        const v = need(i, a).toUpperCase();
        if (v !== 'RI' && v !== 'MA' && v !== 'DB') throw badInput([a], 'must be RI, MA or DB', v, 'E_SPECTRAL_ARGS');
        touchstone.format = v;
        i++;
        break;
      }
      case '--until': untilS = quantity(i, a, 's', 'a time above 0 s such as 200us'); i++; break;
      case '--every': everyS = quantity(i, a, 's', 'a time above 0 s such as 2us'); i++; break;
      case '--fmax': fmax = quantity(i, a, 'Hz', 'a frequency above 0 Hz such as 4MHz'); i++; break;
      case '--inversion': {
        const v = need(i, a);
        if (v !== 'fourier' && v !== 'laplace') throw badInput([a], 'must be fourier or laplace', v, 'E_SPECTRAL_ARGS');
        inversion = v;
        i++;
        break;
      }
      case '--aliasing': {
        const v = need(i, a);
        aliasing = Number(v);
        if (!(aliasing > 0 && aliasing <= 0.1)) throw badInput([a], 'must be a fraction above 0 and at most 0.1, such as 1e-10', v, 'E_SPECTRAL_ARGS');
        i++;
        break;
      }
      case '--excitation': {
        const v = need(i, a);
        if (v !== 'unit' && v !== 'waveform') throw badInput([a], 'must be unit or waveform', v, 'E_SPECTRAL_ARGS');
        excitation = v;
        i++;
        break;
      }
      default:
        if (a.startsWith('--')) throw badInput([a], 'is not an option of spectrum (--from, --to, --points, --log, --out, --port, --touchstone, --touchstone-version, --format, --excitation; for a time response --until, --every, --inversion, --aliasing, --fmax)', a, 'E_SPECTRAL_ARGS');
        if (file !== undefined) throw badInput(['scenario'], 'must be given once', a, 'E_SPECTRAL_ARGS');
        file = a;
    }
  }
  if (file === undefined) throw badInput(['scenario'], 'must be given (the scenario file)', undefined, 'E_SPECTRAL_ARGS');
  if (untilS === undefined) {
    for (const [name, v] of [['--every', everyS], ['--inversion', inversion], ['--aliasing', aliasing], ['--fmax', fmax]] as const) {
      if (v !== undefined) throw badInput([name], 'belongs to a time response and needs --until', v, 'E_SPECTRAL_ARGS');
    }
  } else {
    if (from !== undefined || to !== undefined) throw badInput([from !== undefined ? '--from' : '--to'], 'is for a frequency sweep; a time response (--until) takes --every instead', from ?? to, 'E_SPECTRAL_ARGS');
    if (ports.length > 0 || touchstoneFile !== undefined) throw badInput([ports.length > 0 ? '--port' : '--touchstone'], 'is for a frequency sweep, not a time response (--until)', undefined, 'E_SPECTRAL_ARGS');
    if (everyS === undefined) throw badInput(['--every'], 'must be given with --until (the sample interval, e.g. 1us)', undefined, 'E_SPECTRAL_ARGS');
    if (untilS / everyS > 1e6) throw badInput(['--every'], `gives ${Math.floor(untilS / everyS) + 1} samples up to --until, more than 1 000 001`, everyS, 'E_SPECTRAL_ARGS');
    if (aliasing !== undefined && inversion !== 'laplace') throw badInput(['--aliasing'], 'belongs to --inversion laplace', aliasing, 'E_SPECTRAL_ARGS');
    for (const [k, o] of outputs.entries()) {
      if (o.kind !== 'voltage' && o.kind !== 'current') throw badInput(['--out', k], 'must be v(J.n) or i(line.end) for a time response', outputName(o), 'E_SPECTRAL_ARGS');
    }
    const time: TimeResponseCommand = { untilS, everyS, inversion: inversion ?? 'fourier', aliasing, maxFrequencyHz: fmax };
    return { scenarioFile: file, frequenciesHz: [], outputs, ports, touchstone, excitation, time };
  }
  if (from === undefined) throw badInput(['--from'], 'must be given (start frequency, e.g. 1kHz)', undefined, 'E_SPECTRAL_ARGS');
  if (to === undefined) throw badInput(['--to'], 'must be given (stop frequency, e.g. 1GHz)', undefined, 'E_SPECTRAL_ARGS');
  if (touchstoneFile !== undefined && ports.length === 0) throw badInput(['--touchstone'], 'needs at least one --port', touchstoneFile, 'E_SPECTRAL_ARGS');
  if (touchstoneFile !== undefined && touchstone.version === undefined) {
    // A name ending in .sNp is the version 1 convention; anything else (.ts) gets version 2.
    touchstone.version = /\.s\d+p$/i.test(touchstoneFile) ? 1 : 2;
  }
  return { scenarioFile: file, frequenciesHz: spectrumSweep(from, to, points, log), outputs, ports, touchstoneFile, touchstone, excitation };
}

/**
 * The section for the results file's `spectral` key: every output series and, when S-parameters
 * were computed, one series per entry named `S<i><j>` (unit 1), i and j the port numbers (1-based).
 * @example spectralSection(result).series.map((s) => s.name) // ['v(L.l)', 'S11', 'S12', 'S21', 'S22']
 */
export function spectralSection(result: SpectrumResult): SpectralResults {
  const series = result.series.map((s) => ({ name: s.name, unit: s.unit, re: [...s.re], im: [...s.im] }));
  const sp = result.sParameters;
  if (sp) {
    const P = sp.ports.length;
    for (let i = 0; i < P; i++) {
      for (let j = 0; j < P; j++) {
        const re: number[] = [];
        const im: number[] = [];
        for (let k = 0; k < sp.frequenciesHz.length; k++) { re.push(sp.re[k * P * P + i * P + j]); im.push(sp.im[k * P * P + i * P + j]); }
        series.push({ name: P > 9 ? `S${i + 1},${j + 1}` : `S${i + 1}${j + 1}`, unit: '1', re, im });
      }
    }
  }
  return { frequenciesHz: [...result.frequenciesHz], series };
}

/**
 * A plain-text table: frequency [Hz], then per series magnitude and phase [deg], tab-separated,
 * one header line.
 * @example formatSpectrumTable(spectralSection(result)).split('\n')[0] // "f [Hz]\t|v(L.l)| [V]\targ v(L.l) [deg]"
 */
export function formatSpectrumTable(section: SpectralResults): string {
  const head = ['f [Hz]'];
  for (const s of section.series) head.push(`|${s.name}| [${s.unit}]`, `arg ${s.name} [deg]`);
  const rows = [head.join('\t')];
  section.frequenciesHz.forEach((f, k) => {
    const cells = [f.toPrecision(6)];
    for (const s of section.series) {
      cells.push(Math.hypot(s.re[k], s.im[k]).toPrecision(8), ((Math.atan2(s.im[k], s.re[k]) * 180) / Math.PI).toFixed(3));
    }
    rows.push(cells.join('\t'));
  });
  return `${rows.join('\n')}\n`;
}

/**
 * Runs a parsed spectrum command on a resolved scenario.
 * @returns the results section, the table text and the Touchstone text when a file was asked for.
 * @throws as solveSpectrum and toTouchstone.
 * @example const out = await runSpectrumCommand(parseSpectrumArgs(argv), scenario, registry)
 */
export async function runSpectrumCommand(cmd: SpectrumCommand, scenario: ResolvedScenario, registry: PluginRegistry): Promise<{ section: SpectralResults; table: string; touchstone?: string; time?: TimeResponse }> {
  if (cmd.time) {
    const tc = cmd.time;
    const n = Math.floor(tc.untilS / tc.everyS + 1e-9) + 1;
    const timesS = Array.from({ length: n }, (_, i) => i * tc.everyS);
    const outs = cmd.outputs.length > 0 ? cmd.outputs : defaultOutputs(scenario);
    const time = await timeResponse(scenario, registry, { outputs: outs, timesS, method: tc.inversion, aliasing: tc.aliasing, maxFrequencyHz: tc.maxFrequencyHz });
    return { section: { frequenciesHz: [], series: [] }, table: formatTimeTable(time), time };
  }
  const outputs = cmd.outputs.length > 0 || cmd.ports.length > 0 ? cmd.outputs : defaultOutputs(scenario);
  const result = await solveSpectrum(scenario, registry, { frequenciesHz: cmd.frequenciesHz, outputs, ports: cmd.ports, excitation: cmd.excitation });
  const section = spectralSection(result);
  const out: { section: SpectralResults; table: string; touchstone?: string } = { section, table: formatSpectrumTable(section) };
  if (cmd.touchstoneFile !== undefined && result.sParameters) {
    out.touchstone = toTouchstone(result.sParameters, { ...cmd.touchstone, comments: [`skein spectrum: ${scenario.title || scenario.file || 'scenario'}`] });
  }
  return out;
}

/**
 * A plain-text table of a time response: time [s], then one column per output, tab-separated, one
 * header line, and a comment line with the method's parameters.
 * @example formatTimeTable(t).split('\n')[1] // "t [s]\tv(L.l) [V]"
 */
export function formatTimeTable(t: TimeResponse): string {
  const m = t.method;
  const about = m.kind === 'laplace'
    ? `# numerical Laplace transform: sigma ${m.sigmaPerS.toPrecision(6)} 1/s, period ${m.periodS.toPrecision(6)} s, ${m.points} points to ${m.maxFrequencyHz.toPrecision(6)} Hz, window ${m.window}, aliasing bound ${m.aliasingBound.toExponential(2)}`
    : `# Fourier series: period ${m.periodS.toPrecision(6)} s after ${m.passes} pass(es), ${m.points} points to ${m.maxFrequencyHz.toPrecision(6)} Hz, window ${m.window}, wrap-around estimate ${Number.isNaN(m.wrapEstimate) ? 'none (one pass)' : m.wrapEstimate.toExponential(2)}`;
  const rows = [about, ['t [s]', ...t.series.map((s) => `${s.name} [${s.unit}]`)].join('\t')];
  t.timesS.forEach((ts, q) => rows.push([ts.toPrecision(8), ...t.series.map((s) => s.values[q].toPrecision(10))].join('\t')));
  return `${rows.join('\n')}\n`;
}

/** Without --out or --port: every node voltage. */
function defaultOutputs(scenario: ResolvedScenario): SpectralOutput[] {
  const out: SpectralOutput[] = [];
  for (const j of scenario.junctions) for (const n of j.nodes) out.push({ kind: 'voltage', node: `${j.id}.${n}` });
  return out;
}
