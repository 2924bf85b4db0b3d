/**
 * What a command line needs: argument parsing for a spectrum run, the results-file section and a
 * plain-text table. The CLI package wires these to `skein spectrum`; nothing here touches files.
 */
import { badInput, parseQuantity, type PluginRegistry, type ResolvedScenario } from '@skein/core';
import { parseOutputSpec, parsePortSpec, solveSpectrum, spectrumSweep, type SpectralOutput, type SpectralPort, type SpectralResults, type SpectrumResult } from './spectrum.ts';
import { toTouchstone, type TouchstoneOptions } from './touchstone.ts';

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
}

/**
 * Parses `scenario.yaml --from 1kHz --to 1GHz --points 401 [--log] [--out v(J.n)]... [--port J.n[:50ohm]]...
 * [--touchstone file.s2p] [--touchstone-version 1|2] [--format RI|MA|DB] [--excitation unit|waveform]`.
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
      case '--excitation': {
        const v = need(i, a);
        if (v !== 'unit' && v !== 'waveform') throw badInput([a], 'must be unit or waveform', v, 'E_SPECTRAL_ARGS');
        excitation = v;
        i++;
        break;
      }
      default:
        if (a.startsWith('--')) throw badInput([a], 'is not an option of spectrum (--from, --to, --points, --log, --out, --port, --touchstone, --touchstone-version, --format, --excitation)', a, 'E_SPECTRAL_ARGS');
        if (file !== undefined) throw badInput(['scenario'], 'must be given once', a, 'E_SPECTRAL_ARGS');
        file = a;
    }
  }
  if (file === undefined) throw badInput(['scenario'], 'must be given (the scenario file)', undefined, 'E_SPECTRAL_ARGS');
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
export async function runSpectrumCommand(cmd: SpectrumCommand, scenario: ResolvedScenario, registry: PluginRegistry): Promise<{ section: SpectralResults; table: string; touchstone?: string }> {
  const outputs = cmd.outputs.length > 0 || cmd.ports.length > 0 ? cmd.outputs : defaultOutputs(scenario);
  const result = await solveSpectrum(scenario, registry, { frequenciesHz: cmd.frequenciesHz, outputs, ports: cmd.ports, excitation: cmd.excitation });
  const section = spectralSection(result);
  const out: { section: SpectralResults; table: string; touchstone?: string } = { section, table: formatSpectrumTable(section) };
  if (cmd.touchstoneFile !== undefined && result.sParameters) {
    out.touchstone = toTouchstone(result.sParameters, { ...cmd.touchstone, comments: [`skein spectrum: ${scenario.title || scenario.file || 'scenario'}`] });
  }
  return out;
}

/** Without --out or --port: every node voltage. */
function defaultOutputs(scenario: ResolvedScenario): SpectralOutput[] {
  const out: SpectralOutput[] = [];
  for (const j of scenario.junctions) for (const n of j.nodes) out.push({ kind: 'voltage', node: `${j.id}.${n}` });
  return out;
}
