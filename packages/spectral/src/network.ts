/**
 * The network in the frequency domain: global node numbering over all junctions, plugin instances,
 * and the modified nodal system (MNA) at one angular frequency, or at one complex frequency
 * s = sigma + j omega for the numerical Laplace transform (loads by `admittanceAt`, sections by
 * `zyAtLaplace`, constant lines by Z = R + s L, Y = G + s C).
 *
 * Unknowns: every junction node voltage (global numbering: junction by junction, nodes in their
 * order), one branch current per ideal voltage drive and per short, then per line its 2n modal
 * wave amplitudes (forward at z = 0, backward at z = l; see lineModes). A line enters as its wave
 * equations between its end nodes (equivalent to its admittance block, but regular at the
 * half-wave resonances of a lossless line), loads by their `admittance` hook, a voltage drive with series R as its
 * Norton equivalent, an ideal voltage drive (R = 0) and a short as a constraint row, a current
 * drive as an injection with its parallel conductance (modified nodal analysis: Ho, Ruehli &
 * Brennan, IEEE Trans. CAS 22(6), 1975, from memory).
 */
import {
  badInput, SkeinError, PluginError,
  type LoadInstance, type PluginRegistry, type ResolvedLine, type ResolvedPart, type ResolvedScenario, type SetupContext, type WaveformInstance,
} from '@skein/core';
import { missingHook, notContinuable, singularNetwork, spectralBug } from './errors.ts';
import { cFrom, cLu, cLuSolve, cZeros, type CLu, type CMatrix } from './complex.ts';
import { lineModes, type LineModes } from './lineBlock.ts';

/** A line of the network with its end nodes (global indices, per conductor). */
interface NetLine {
  line: ResolvedLine;
  n: number;
  nodes0: Int32Array;
  nodes1: Int32Array;
  /** First MNA unknown of its wave amplitudes: a (n, forward at z = 0), then b (n, backward at z = l). */
  offset: number;
}

/** A part of the network with its terminals (global node indices, -1 = reference). */
export interface NetPart {
  part: ResolvedPart;
  plus: number;
  minus: number;
  /** Loads: the instance. */
  load?: LoadInstance;
  /** Sources: index into `waveforms`. */
  waveform?: number;
  /** Row of its branch current in the MNA system (ideal voltage drives and shorts), else -1. */
  row: number;
}

/** A compiled frequency-domain network. */
export interface SpectralNetwork {
  scenario: ResolvedScenario;
  /** Number of junction nodes (global). */
  nNodes: number;
  /** Size of the MNA system (nodes + constraint rows). */
  size: number;
  /** Global index of the first node of each junction. */
  nodeOffset: Int32Array;
  lines: NetLine[];
  parts: NetPart[];
  waveforms: WaveformInstance[];
  /** "junction.node" of each global node. */
  nodeNames: string[];
}

/** Per-source excitation of one solve: phasor [re, im] of each source part, or null to remove it. */
export type SourceState = Array<{ re: number; im: number } | null>;

/** The system at one frequency: factors and line blocks. */
export interface Assembled {
  omegaRadS: number;
  /** Damping shift sigma [1/s] of the complex frequency s = sigma + j omega (0 on the j omega axis). */
  sigma: number;
  lu: CLu;
  /** Modal solution of each line at this frequency. */
  modes: LineModes[];
  /** Load admittances [S], per part (NaN for sources and shorts). */
  partYRe: Float64Array;
  partYIm: Float64Array;
}

/**
 * Compiles a resolved scenario for spectral runs: creates the waveform and load instances and checks
 * that every linear or nonlinear load has the `admittance` hook.
 * @param scenario from resolveScenarioText; @param registry the plugins the scenario names.
 * @throws SkeinError E_SPECTRAL_HOOK_MISSING (details: plugin, hook, part) for a load without
 *   `admittance`; PluginError when a plugin's create fails.
 * @example const net = await compileNetwork(resolveScenarioText(text, { registry }), registry)
 */
export async function compileNetwork(scenario: ResolvedScenario, registry: PluginRegistry): Promise<SpectralNetwork> {
  const nodeOffset = new Int32Array(scenario.junctions.length + 1);
  const nodeNames: string[] = [];
  scenario.junctions.forEach((j, i) => {
    nodeOffset[i + 1] = nodeOffset[i] + j.nodes.length;
    for (const nd of j.nodes) nodeNames.push(`${j.id}.${nd}`);
  });
  const nNodes = nodeOffset[scenario.junctions.length];
  const lines: NetLine[] = scenario.lines.map((line) => {
    if (line.profile) {
      // A line whose parameters vary along it (stretches, taper) is stepped by FDTD in the time
      // domain only; its chain matrix here would need the profile, which this solver does not read.
      const key = line.profile.kind === 'stretches' ? 'stretches' : 'taper';
      throw badInput([...line.path, key], 'is available in the time-domain solver only in this version; for a frequency-domain run write the line as uniform lines joined at junctions', line.profile.kind, 'E_SPECTRAL_VARYING', scenario.locate([...line.path, key]));
    }
    const n = line.conductors.length;
    return { line, n, nodes0: new Int32Array(n).fill(-1), nodes1: new Int32Array(n).fill(-1), offset: -1 };
  });
  scenario.junctions.forEach((j, ji) => {
    for (const p of j.ports) (p.end === 0 ? lines[p.line].nodes0 : lines[p.line].nodes1)[p.conductor] = nodeOffset[ji] + p.node;
  });
  for (const l of lines) {
    if ([...l.nodes0, ...l.nodes1].some((x) => x < 0)) throw spectralBug(`line ${l.line.id} has an unwired conductor after resolution`);
  }
  const dtS = scenario.time.stepS ?? scenario.time.endS / 1e4;
  const ctxFor = (id: string): SetupContext => ({ dtS, endS: scenario.time.endS, id, warn: () => undefined });
  const waveforms: WaveformInstance[] = [];
  const waveformKeys = new Map<string, number>();
  const parts: NetPart[] = [];
  let size = nNodes;
  for (const [ji, j] of scenario.junctions.entries()) {
    for (const p of j.parts) {
      const plus = p.plus < 0 ? -1 : nodeOffset[ji] + p.plus;
      const minus = p.minus < 0 ? -1 : nodeOffset[ji] + p.minus;
      if (p.role === 'source') {
        const key = `${p.type}:${JSON.stringify(p.params)}`;
        let w = waveformKeys.get(key);
        if (w === undefined) {
          const plugin = registry.sources.get(p.type)?.plugin;
          if (!plugin) throw spectralBug(`source type ${p.type} passed resolution but is not registered`);
          let inst: WaveformInstance;
          try {
            inst = await plugin.create(p.params as never, ctxFor(p.id));
          } catch (e) {
            throw new PluginError(p.type, 'create', e, { part: p.id });
          }
          w = waveforms.length;
          waveforms.push(inst);
          waveformKeys.set(key, w);
        }
        const row = p.drive === 'voltage' && p.resistanceOhm === 0 ? size++ : -1;
        parts.push({ part: p, plus, minus, waveform: w, row });
      } else {
        const plugin = registry.loads.get(p.type)?.plugin;
        if (!plugin) throw spectralBug(`load type ${p.type} passed resolution but is not registered`);
        let inst: LoadInstance;
        try {
          inst = await plugin.create(p.params as never, ctxFor(p.id));
        } catch (e) {
          throw new PluginError(p.type, 'create', e, { part: p.id });
        }
        if (inst.kind !== 'short' && typeof inst.admittance !== 'function' && typeof inst.admittanceAt !== 'function') {
          throw missingHook(p.type, 'admittance', p.id, 'load');
        }
        parts.push({ part: p, plus, minus, load: inst, row: inst.kind === 'short' ? size++ : -1 });
      }
    }
  }
  for (const l of lines) {
    l.offset = size;
    size += 2 * l.n;
  }
  return { scenario, nNodes, size, nodeOffset, lines, parts, waveforms, nodeNames };
}

/**
 * The global index of a node named "junction.node".
 * @param path where the name came from (for the error).
 * @throws InputError E_SPECTRAL_NODE naming the accepted nodes.
 * @example nodeIndex(net, 'L.l') // 1
 */
export function nodeIndex(net: SpectralNetwork, name: string, path: ReadonlyArray<string | number> = ['node']): number {
  const i = net.nodeNames.indexOf(name);
  if (i < 0) {
    const list = net.nodeNames.length > 12 ? `${net.nodeNames.slice(0, 12).join(', ')}, ...` : net.nodeNames.join(', ');
    throw badInput(path, `must name a node as junction.node (${list})`, name, 'E_SPECTRAL_NODE');
  }
  return i;
}

/**
 * Z and Y per metre of a line at s = sigma + j omega: constant R, L, G, C (Z = R + s L, Y = G + s C),
 * or the section's zyAt on the j omega axis and its zyAtLaplace off it.
 * @throws SkeinError E_SPECTRAL_COMPLEX_FREQUENCY when the section has no continuation to complex s.
 */
function lineZY(l: ResolvedLine, omega: number, sigma: number): { z: CMatrix; y: CMatrix } {
  const n = l.conductors.length;
  if (l.section) {
    if (sigma === 0) {
      const zy = l.section.zyAt(omega / (2 * Math.PI));
      return { z: cFrom(n, n, zy.Zre, zy.Zim), y: cFrom(n, n, zy.Yre, zy.Yim) };
    }
    if (typeof l.section.zyAtLaplace !== 'function') throw notContinuable(`line ${l.id}`, `its section (${l.section.describe}) has no zyAtLaplace(sigma, omega)`);
    let zy;
    try {
      zy = l.section.zyAtLaplace(sigma, omega);
    } catch (e) {
      throw notContinuable(`line ${l.id}`, (e as Error).message);
    }
    return { z: cFrom(n, n, zy.Zre, zy.Zim), y: cFrom(n, n, zy.Yre, zy.Yim) };
  }
  const z = cZeros(n);
  const y = cZeros(n);
  for (let i = 0; i < n * n; i++) {
    z.re[i] = l.R[i] + sigma * l.L[i];
    z.im[i] = omega * l.L[i];
    y.re[i] = l.G[i] + sigma * l.C[i];
    y.im[i] = omega * l.C[i];
  }
  return { z, y };
}

function add(m: CMatrix, i: number, j: number, re: number, im: number): void {
  if (i < 0 || j < 0) return;
  m.re[i * m.cols + j] += re;
  m.im[i * m.cols + j] += im;
}

/** Stamps an admittance y between nodes p and q (-1 = reference). */
export function stampAdmittance(m: CMatrix, p: number, q: number, re: number, im: number): void {
  add(m, p, p, re, im);
  add(m, q, q, re, im);
  add(m, p, q, -re, -im);
  add(m, q, p, -re, -im);
}

/**
 * Assembles and factors the MNA matrix at s = sigma + j omega (sigma = 0: the j omega axis). Sources
 * listed as null in `removed` are taken out; all others keep their internal resistance (their EMF
 * enters only the right-hand side). `extraShunts` adds admittances from nodes to the reference
 * (port terminations).
 * @param sigma damping shift [1/s], default 0; off the axis every load needs `admittanceAt`.
 * @throws NumericalError E_SPECTRAL_SINGULAR naming the frequency and the node; SkeinError
 *   E_SPECTRAL_HOOK_MISSING for a load without admittanceAt at sigma != 0, E_SPECTRAL_COMPLEX_FREQUENCY
 *   for a section without a continuation.
 */
export function assemble(net: SpectralNetwork, omegaRadS: number, removed: readonly boolean[], extraShunts: ReadonlyArray<{ node: number; re: number; im: number }> = [], sigma = 0): Assembled {
  const a = cZeros(net.size);
  const modes: LineModes[] = [];
  for (const l of net.lines) {
    const { z, y } = lineZY(l.line, omegaRadS, sigma);
    const md = lineModes(z, y, l.line.lengthM);
    modes.push(md);
    const n = l.n;
    // KCL: current into the line at z = 0 is T (a - E b), at z = l it is T (b - E a).
    // Rows of the line: M (a + E b) - V(0) = 0 and M (E a + b) - V(l) = 0, scaled by 1 / max|M|.
    let scale = 0;
    for (let i = 0; i < n * n; i++) scale = Math.max(scale, Math.hypot(md.m.re[i], md.m.im[i]));
    const inv = scale > 0 ? 1 / scale : 1;
    const oa = l.offset, ob = l.offset + n;
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const tr = md.t.re[i * n + j], ti = md.t.im[i * n + j];
        const er = md.eRe[j], ei = md.eIm[j];
        const ter = tr * er - ti * ei, tei = tr * ei + ti * er;
        add(a, l.nodes0[i], oa + j, tr, ti);
        add(a, l.nodes0[i], ob + j, -ter, -tei);
        add(a, l.nodes1[i], ob + j, tr, ti);
        add(a, l.nodes1[i], oa + j, -ter, -tei);
        const mr = md.m.re[i * n + j] * inv, mi = md.m.im[i * n + j] * inv;
        const mer = mr * er - mi * ei, mei = mr * ei + mi * er;
        add(a, oa + i, oa + j, mr, mi);
        add(a, oa + i, ob + j, mer, mei);
        add(a, ob + i, oa + j, mer, mei);
        add(a, ob + i, ob + j, mr, mi);
      }
      add(a, oa + i, l.nodes0[i], -inv, 0);
      add(a, ob + i, l.nodes1[i], -inv, 0);
    }
  }
  const partYRe = new Float64Array(net.parts.length).fill(NaN);
  const partYIm = new Float64Array(net.parts.length).fill(NaN);
  const out = new Float64Array(2);
  net.parts.forEach((np, k) => {
    if (removed[k]) {
      // A removed ideal drive keeps its unknown, decoupled: current 0.
      if (np.row >= 0) add(a, np.row, np.row, 1, 0);
      return;
    }
    const p = np.part;
    if (np.row >= 0) {
      add(a, np.plus, np.row, 1, 0);
      add(a, np.minus, np.row, -1, 0);
      add(a, np.row, np.plus, 1, 0);
      add(a, np.row, np.minus, -1, 0);
      return;
    }
    if (np.load) {
      out[0] = NaN;
      out[1] = NaN;
      const ld = np.load as { admittance?(w: number, o: Float64Array): void; admittanceAt?(sg: number, w: number, o: Float64Array): void };
      // On the axis the plain hook keeps earlier results bit for bit; off it only admittanceAt knows Y(s).
      const hook = sigma === 0 && typeof ld.admittance === 'function' ? 'admittance' : 'admittanceAt';
      if (hook === 'admittanceAt' && typeof ld.admittanceAt !== 'function') throw missingHook(p.type, 'admittanceAt', p.id, 'load');
      try {
        if (hook === 'admittance') ld.admittance!(omegaRadS, out);
        else ld.admittanceAt!(sigma, omegaRadS, out);
      } catch (e) {
        throw new PluginError(p.type, hook, e, { part: p.id });
      }
      if (!Number.isFinite(out[0]) || !Number.isFinite(out[1])) {
        throw new PluginError(p.type, hook, new Error(`admittance at s = ${sigma} + j${omegaRadS} 1/s must be finite, got ${out[0]} + j${out[1]}`), { part: p.id });
      }
      partYRe[k] = out[0];
      partYIm[k] = out[1];
      stampAdmittance(a, np.plus, np.minus, out[0], out[1]);
      return;
    }
    if (Number.isFinite(p.resistanceOhm) && p.resistanceOhm > 0) stampAdmittance(a, np.plus, np.minus, 1 / p.resistanceOhm, 0);
  });
  for (const s of extraShunts) add(a, s.node, s.node, s.re, s.im);
  let lu: CLu;
  try {
    lu = cLu(a);
  } catch (e) {
    if (!(e instanceof SkeinError) || e.code !== 'E_SINGULAR') throw e;
    const row = (e.details.row as number) ?? 0;
    const where = row < net.nNodes ? `node ${net.nodeNames[row]}` : row < (net.lines[0]?.offset ?? net.size) ? 'a constraint row (an ideal voltage drive or short in a loop of others)' : 'the wave equations of a line';
    throw singularNetwork(omegaRadS / (2 * Math.PI), where, row);
  }
  return { omegaRadS, sigma, lu, modes, partYRe, partYIm };
}

/**
 * Right-hand side for one set of source phasors (null entries: source inactive or removed).
 * Each column of the result is one excitation.
 */
export function sourceRhs(net: SpectralNetwork, states: SourceState[]): CMatrix {
  const m = states.length;
  const b = cZeros(net.size, m);
  states.forEach((st, col) => {
    net.parts.forEach((np, k) => {
      const ph = st[k];
      if (!ph || np.waveform === undefined) return;
      const p = np.part;
      const put = (row: number, re: number, im: number): void => {
        if (row < 0) return;
        b.re[row * m + col] += re;
        b.im[row * m + col] += im;
      };
      if (p.drive === 'voltage') {
        if (np.row >= 0) put(np.row, ph.re, ph.im);
        else {
          put(np.plus, ph.re / p.resistanceOhm, ph.im / p.resistanceOhm);
          put(np.minus, -ph.re / p.resistanceOhm, -ph.im / p.resistanceOhm);
        }
      } else {
        put(np.plus, ph.re, ph.im);
        put(np.minus, -ph.re, -ph.im);
      }
    });
  });
  return b;
}

/** Solves the assembled system for the given right-hand sides. */
export function solveAssembled(asm: Assembled, rhs: CMatrix): CMatrix {
  return cLuSolve(asm.lu, rhs);
}

/** Line indices by id. @throws InputError E_SPECTRAL_LINE naming the lines. */
export function lineIndex(net: SpectralNetwork, id: string, path: ReadonlyArray<string | number>): number {
  const i = net.lines.findIndex((l) => l.line.id === id);
  if (i < 0) throw badInput(path, `must name a line (${net.lines.map((l) => l.line.id).join(', ')})`, id, 'E_SPECTRAL_LINE');
  return i;
}
