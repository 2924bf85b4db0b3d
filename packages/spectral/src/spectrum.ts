/**
 * Frequency sweeps of a whole network: node voltages, line-end and part currents, transfer
 * functions, input impedance and S-parameters, as plain data for the results file's `spectral` key.
 */
import { badInput, parseQuantity, type PluginRegistry, type ResolvedScenario } from '@skein/core';
import { cZeros } from './complex.ts';
import { missingHook } from './errors.ts';
import { assemble, compileNetwork, lineIndex, nodeIndex, solveAssembled, sourceRhs, type Assembled, type SourceState, type SpectralNetwork } from './network.ts';

/** What to compute at each frequency. Names default to the text form (`v(J.n)` etc.). */
export type SpectralOutput =
  /** Node voltage to the reference [V] for the scenario's sources at unit EMF (or their spectrum). */
  | { kind: 'voltage'; node: string; name?: string }
  /** Current into the line at one end of one conductor, away from the junction [A]. */
  | { kind: 'current'; line: string; end: 'from' | 'to'; conductor?: string; name?: string }
  /** Current through a part from its plus to its minus terminal [A] (a source: out of its plus terminal). */
  | { kind: 'part-current'; part: string; name?: string }
  /** Ratio of two node voltages V(to) / V(from) [1]. */
  | { kind: 'transfer'; to: string; from: string; name?: string }
  /** Impedance between a node and the reference [ohm], sources on that node taken out, others at rest. */
  | { kind: 'impedance'; node: string; name?: string };

/** One complex spectrum, one value per frequency. */
export interface SpectralSeries {
  name: string;
  unit: string;
  re: number[];
  im: number[];
}

/** The section written into the results file under `spectral` (packages/report plots it). */
export interface SpectralResults {
  frequenciesHz: number[];
  series: SpectralSeries[];
}

/** A port for S-parameters: a node to the reference with a real reference impedance. */
export interface SpectralPort {
  node: string;
  /** Reference impedance [ohm], real and > 0 (default 50). */
  referenceOhm?: number;
}

/** S-parameters over frequency. Entry (i, j) at frequency k sits at k*P*P + i*P + j. */
export interface SParameters {
  frequenciesHz: number[];
  ports: Array<{ node: string; referenceOhm: number }>;
  re: Float64Array;
  im: Float64Array;
}

/** Options of solveSpectrum. */
export interface SpectrumOptions {
  /** Frequencies [Hz], each > 0. */
  frequenciesHz: readonly number[];
  outputs?: readonly SpectralOutput[];
  /** When given, S-parameters between these ports are computed too. */
  ports?: readonly SpectralPort[];
  /**
   * Source phasors: 'unit' (default) drives every source with EMF 1 V (or 1 A) at zero phase, so
   * node voltages are transfer functions from the EMF; 'waveform' uses each waveform's spectrum
   * W(j omega) from its `laplace` hook (a waveform without it is an error naming plugin and hook).
   */
  excitation?: 'unit' | 'waveform';
}

/** The result of solveSpectrum. */
export interface SpectrumResult extends SpectralResults {
  sParameters?: SParameters;
}

/**
 * A frequency grid from `fromHz` to `toHz` (both included).
 * @param points number of points, >= 2 (1 gives [fromHz]); @param log logarithmic spacing when true.
 * @throws InputError E_SPECTRAL_SWEEP for from <= 0 with log, to < from, or points < 1.
 * @example spectrumSweep(1e3, 1e9, 7, true) // [1e3, 1e4, ..., 1e9]
 */
export function spectrumSweep(fromHz: number, toHz: number, points: number, log: boolean): number[] {
  if (!(Number.isInteger(points) && points >= 1)) throw badInput(['points'], 'must be a whole number of at least 1', points, 'E_SPECTRAL_SWEEP');
  if (!(fromHz > 0)) throw badInput(['from'], 'must be a frequency above 0 Hz', fromHz, 'E_SPECTRAL_SWEEP');
  if (!(toHz >= fromHz)) throw badInput(['to'], `must be at least the start frequency (${fromHz} Hz)`, toHz, 'E_SPECTRAL_SWEEP');
  if (points === 1) return [fromHz];
  const out: number[] = [];
  for (let k = 0; k < points; k++) {
    const u = k / (points - 1);
    out.push(log ? fromHz * Math.pow(toHz / fromHz, u) : fromHz + (toHz - fromHz) * u);
  }
  out[points - 1] = toHz;
  return out;
}

/**
 * Parses an output in text form: `v(J.n)`, `i(line.from.conductor)` (conductor optional for one
 * conductor), `ip(part)`, `h(J.b/J.a)`, `z(J.a)`.
 * @throws InputError E_SPECTRAL_OUTPUT listing the accepted forms.
 * @example parseOutputSpec('h(L.l/S.s)') // { kind: 'transfer', to: 'L.l', from: 'S.s' }
 */
export function parseOutputSpec(text: string, path: ReadonlyArray<string | number> = ['output']): SpectralOutput {
  const m = /^\s*(v|i|ip|h|z)\(\s*([^)]*?)\s*\)\s*$/.exec(text);
  const fail = (): never => { throw badInput(path, 'must be one of v(J.node), i(line.from|to[.conductor]), ip(part), h(J.to/J.from), z(J.node)', text, 'E_SPECTRAL_OUTPUT'); };
  if (!m) return fail();
  const [, k, arg] = m;
  if (k === 'v') return { kind: 'voltage', node: arg };
  if (k === 'z') return { kind: 'impedance', node: arg };
  if (k === 'ip') return { kind: 'part-current', part: arg };
  if (k === 'h') {
    const [to, from] = arg.split('/').map((s) => s.trim());
    if (!to || !from) return fail();
    return { kind: 'transfer', to, from };
  }
  const [line, end, conductor] = arg.split('.');
  if (!line || (end !== 'from' && end !== 'to')) return fail();
  return conductor ? { kind: 'current', line, end, conductor } : { kind: 'current', line, end };
}

/**
 * Parses a port in text form `J.node` or `J.node:75ohm` (reference impedance, default 50 ohm).
 * @throws InputError E_SPECTRAL_PORT for a reference that is not a positive resistance.
 * @example parsePortSpec('J1.a:75ohm') // { node: 'J1.a', referenceOhm: 75 }
 */
export function parsePortSpec(text: string, path: ReadonlyArray<string | number> = ["port"]): { node: string; referenceOhm: number } {
  const [node, ref] = text.split(':');
  let r = 50;
  if (ref !== undefined) {
    r = parseQuantity(ref.trim(), 'ohm') ?? NaN;
  }
  if (!node || !(r > 0 && Number.isFinite(r))) throw badInput(path, 'must be junction.node or junction.node:R with R a positive resistance (e.g. J1.a:50ohm)', text, 'E_SPECTRAL_PORT');
  return { node: node.trim(), referenceOhm: r };
}

/** Text name of an output. */
export function outputName(o: SpectralOutput): string {
  if (o.name) return o.name;
  switch (o.kind) {
    case 'voltage': return `v(${o.node})`;
    case 'current': return `i(${o.line}.${o.end}${o.conductor ? `.${o.conductor}` : ''})`;
    case 'part-current': return `ip(${o.part})`;
    case 'transfer': return `h(${o.to}/${o.from})`;
    case 'impedance': return `z(${o.node})`;
  }
}

/** A resolved output: what to read from the solution. */
interface PlannedOutput {
  name: string;
  unit: string;
  read: (f: number, omega: number) => [number, number];
}

/**
 * Solves the network at each frequency.
 * @param scenario resolved scenario; @param registry its plugins (loads need `admittance`).
 * @param options frequencies [Hz], outputs, ports, excitation.
 * @returns plain data: frequenciesHz and one series per output (unit V, A, 1 or ohm), plus
 *   S-parameters when ports are given.
 * @throws InputError for unknown nodes, lines, parts or bad ports; SkeinError E_SPECTRAL_HOOK_MISSING;
 *   E_SPECTRAL_SINGULAR when the nodal system is singular at a frequency.
 * @example await solveSpectrum(s, reg, { frequenciesHz: [1e7], outputs: [{ kind: 'voltage', node: 'L.l' }] })
 */
export async function solveSpectrum(scenario: ResolvedScenario, registry: PluginRegistry, options: SpectrumOptions): Promise<SpectrumResult> {
  const net = await compileNetwork(scenario, registry);
  return solveNetworkSpectrum(net, options);
}

/** solveSpectrum on a compiled network (reuse it across calls). */
export function solveNetworkSpectrum(net: SpectralNetwork, options: SpectrumOptions): SpectrumResult {
  const freqs = [...options.frequenciesHz];
  freqs.forEach((f, i) => { if (!(f > 0 && Number.isFinite(f))) throw badInput(['frequenciesHz', i], 'must be a frequency above 0 Hz', f, 'E_SPECTRAL_SWEEP'); });
  const outputs = options.outputs ?? [];
  const excitation = options.excitation ?? 'unit';
  const nParts = net.parts.length;
  const noRemoved = new Array<boolean>(nParts).fill(false);
  const w = new Float64Array(2);
  if (excitation === 'waveform') {
    for (const np of net.parts) {
      if (np.waveform !== undefined && typeof net.waveforms[np.waveform].laplace !== 'function') {
        throw missingHook(np.part.type, 'laplace', np.part.id, 'waveform');
      }
    }
  }
  let current: SourceState = [];
  const phasors = (omega: number): SourceState => {
    current = net.parts.map((np) => {
      if (np.waveform === undefined) return null;
      if (excitation === 'unit') return { re: 1, im: 0 };
      net.waveforms[np.waveform].laplace!(0, omega, w);
      return { re: w[0], im: w[1] };
    });
    return current;
  };
  // Per-frequency state shared by the readers.
  let asm: Assembled | undefined;
  let x = cZeros(1);
  const planned: PlannedOutput[] = outputs.map((o, oi) => planOutput(net, o, oi, () => asm!, () => x, () => current));
  const series: SpectralSeries[] = planned.map((p) => ({ name: p.name, unit: p.unit, re: [], im: [] }));
  const impedanceOutputs = outputs.map((o, i) => (o.kind === 'impedance' ? i : -1)).filter((i) => i >= 0);
  const ports = (options.ports ?? []).map((p, i) => ({ node: p.node, index: nodeIndex(net, p.node, ['ports', i, 'node']), referenceOhm: p.referenceOhm ?? 50 }));
  ports.forEach((p, i) => { if (!(p.referenceOhm > 0 && Number.isFinite(p.referenceOhm))) throw badInput(['ports', i, 'referenceOhm'], 'must be a positive resistance in ohm', p.referenceOhm, 'E_SPECTRAL_PORT'); });
  const P = ports.length;
  const sRe = new Float64Array(freqs.length * P * P);
  const sIm = new Float64Array(freqs.length * P * P);
  freqs.forEach((f, k) => {
    const omega = 2 * Math.PI * f;
    if (outputs.length > impedanceOutputs.length) {
      asm = assemble(net, omega, noRemoved);
      x = solveAssembled(asm, sourceRhs(net, [phasors(omega)]));
      planned.forEach((p, i) => {
        if (outputs[i].kind === 'impedance') return;
        const [re, im] = p.read(f, omega);
        series[i].re.push(re);
        series[i].im.push(im);
      });
    }
    for (const i of impedanceOutputs) {
      const o = outputs[i] as Extract<SpectralOutput, { kind: 'impedance' }>;
      const node = nodeIndex(net, o.node, ['outputs', i, 'node']);
      const removed = net.parts.map((np) => np.waveform !== undefined && (np.plus === node || np.minus === node));
      const a = assemble(net, omega, removed);
      const b = cZeros(net.size, 1);
      b.re[node] = 1;
      const z = solveAssembled(a, b);
      series[i].re.push(z.re[node]);
      series[i].im.push(z.im[node]);
    }
    if (P > 0) {
      const removed = net.parts.map((np) => np.waveform !== undefined && ports.some((p) => np.plus === p.index || np.minus === p.index));
      const a = assemble(net, omega, removed, ports.map((p) => ({ node: p.index, re: 1 / p.referenceOhm, im: 0 })));
      const b = cZeros(net.size, P);
      // Incident power wave a_j = 1: EMF 2 sqrt(R_j) behind R_j, Norton current 2 / sqrt(R_j).
      ports.forEach((p, j) => { b.re[p.index * P + j] += 2 / Math.sqrt(p.referenceOhm); });
      const v = solveAssembled(a, b);
      // b_i = (V_i - R_i I_i) / (2 sqrt R_i) with I_i into the network: S_ij = V_i / sqrt(R_i) - delta_ij.
      for (let i = 0; i < P; i++) {
        for (let j = 0; j < P; j++) {
          const q = k * P * P + i * P + j;
          sRe[q] = v.re[ports[i].index * P + j] / Math.sqrt(ports[i].referenceOhm) - (i === j ? 1 : 0);
          sIm[q] = v.im[ports[i].index * P + j] / Math.sqrt(ports[i].referenceOhm);
        }
      }
    }
  });
  const result: SpectrumResult = { frequenciesHz: freqs, series };
  if (P > 0) result.sParameters = { frequenciesHz: freqs, ports: ports.map((p) => ({ node: p.node, referenceOhm: p.referenceOhm })), re: sRe, im: sIm };
  return result;
}

/** Resolves one output to a reader of the current solution. */
function planOutput(net: SpectralNetwork, o: SpectralOutput, oi: number, asm: () => Assembled, sol: () => { re: Float64Array; im: Float64Array }, emf: () => SourceState): PlannedOutput {
  const name = outputName(o);
  const path = ['outputs', oi];
  switch (o.kind) {
    case 'voltage': {
      const n = nodeIndex(net, o.node, [...path, 'node']);
      return { name, unit: 'V', read: () => [sol().re[n], sol().im[n]] };
    }
    case 'impedance':
      nodeIndex(net, o.node, [...path, 'node']);
      return { name, unit: 'ohm', read: () => [NaN, NaN] };
    case 'transfer': {
      const a = nodeIndex(net, o.to, [...path, 'to']);
      const b = nodeIndex(net, o.from, [...path, 'from']);
      return {
        name, unit: '1',
        read: () => {
          const x = sol();
          const d = x.re[b] ** 2 + x.im[b] ** 2;
          return [(x.re[a] * x.re[b] + x.im[a] * x.im[b]) / d, (x.im[a] * x.re[b] - x.re[a] * x.im[b]) / d];
        },
      };
    }
    case 'current': {
      const li = lineIndex(net, o.line, [...path, 'line']);
      const l = net.lines[li];
      let c = 0;
      if (o.conductor !== undefined) {
        c = l.line.conductors.indexOf(o.conductor);
        if (c < 0) throw badInput([...path, 'conductor'], `must name a conductor of line ${l.line.id} (${l.line.conductors.join(', ')})`, o.conductor, 'E_SPECTRAL_OUTPUT');
      } else if (l.n !== 1) {
        throw badInput([...path, 'conductor'], `must name a conductor of line ${l.line.id} (${l.line.conductors.join(', ')}): it has ${l.n}`, undefined, 'E_SPECTRAL_OUTPUT');
      }
      const here0 = o.end === 'from';
      return {
        name, unit: 'A',
        read: () => {
          const md = asm().modes[li];
          const x = sol();
let re = 0, im = 0;
          // Into the line: T (a - E b) at z = 0, T (b - E a) at z = l.
          const oh = here0 ? l.offset : l.offset + l.n, ot = here0 ? l.offset + l.n : l.offset;
          for (let j = 0; j < l.n; j++) {
            const tr = md.t.re[c * l.n + j], ti = md.t.im[c * l.n + j];
            const ur = x.re[oh + j] - (md.eRe[j] * x.re[ot + j] - md.eIm[j] * x.im[ot + j]);
            const ui = x.im[oh + j] - (md.eRe[j] * x.im[ot + j] + md.eIm[j] * x.re[ot + j]);
            re += tr * ur - ti * ui;
            im += tr * ui + ti * ur;
          }
          return [re, im];
        },
      };
    }
    case 'part-current': {
      const k = net.parts.findIndex((p) => p.part.id === o.part);
      if (k < 0) throw badInput([...path, 'part'], `must name a part (${net.parts.map((p) => p.part.id).join(', ')})`, o.part, 'E_SPECTRAL_OUTPUT');
      const np = net.parts[k];
      const v = (x: { re: Float64Array; im: Float64Array }, i: number): [number, number] => (i < 0 ? [0, 0] : [x.re[i], x.im[i]]);
      return {
        name, unit: 'A',
        read: () => {
          const x = sol();
          const [pr, pi] = v(x, np.plus);
          const [mr, mi] = v(x, np.minus);
          const ur = pr - mr, ui = pi - mi;
          if (np.row >= 0) {
            // MNA branch current flows from plus through the branch to minus; a source delivers its negative.
            const s = np.waveform !== undefined ? -1 : 1;
            return [s * x.re[np.row], s * x.im[np.row]];
          }
          if (np.load) {
            const a = asm();
            return [a.partYRe[k] * ur - a.partYIm[k] * ui, a.partYRe[k] * ui + a.partYIm[k] * ur];
          }
          // Source: current out of plus is (e - u) / R for a voltage drive, e - u / R for a current drive.
          const ph = emf()[k] ?? { re: 0, im: 0 };
          const e = [ph.re, ph.im];
          const R = np.part.resistanceOhm;
          if (np.part.drive === 'voltage') return [(e[0] - ur) / R, (e[1] - ui) / R];
          return Number.isFinite(R) ? [e[0] - ur / R, e[1] - ui / R] : [e[0], e[1]];
        },
      };
    }
  }
}
