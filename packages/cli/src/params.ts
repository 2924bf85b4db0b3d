/**
 * `skein params`: per-unit-length parameters of every line of a scenario, at chosen frequencies.
 */
import { decomposeLine, formatQuantity, parseQuantity, InputError, type ResolvedScenario } from '@skein/core';

/** Parameters of one line, plain data (the `--json` output). */
export interface LineParams {
  id: string;
  conductors: string[];
  origin: string;
  /** High-frequency (lossless) L [H/m] and C [F/m], n x n row-major, used by the time-domain solver. */
  L: number[];
  C: number[];
  zcOhm: number[];
  velocitiesMps: number[];
  /** R, L, G, C at each requested frequency (constant when the line was given by matrices). */
  atFrequencies: Array<{ fHz: number; R: number[]; L: number[]; G: number[]; C: number[] }>;
}

/** Parses "50Hz,1MHz,100MHz" into frequencies [Hz]. */
export function parseFrequencies(text: string | undefined): number[] {
  const list = (text ?? '0,50Hz,1MHz,100MHz').split(',').map((s) => s.trim()).filter((s) => s !== '');
  return list.map((s) => {
    const f = parseQuantity(s, 'Hz');
    if (f === undefined || !(f >= 0)) throw new InputError('E_USAGE', ['--at'], 'must list frequencies such as 50Hz,1MHz', s);
    return f;
  });
}

/** Computes the parameters of every line. */
export function lineParams(sc: ResolvedScenario, frequenciesHz: number[]): LineParams[] {
  return sc.lines.map((l) => {
    const m = decomposeLine(l.L, l.C);
    return {
      id: l.id,
      conductors: l.conductors,
      origin: l.origin,
      L: Array.from(l.L),
      C: Array.from(l.C),
      zcOhm: Array.from(m.Zc),
      velocitiesMps: Array.from(m.velocities),
      atFrequencies: frequenciesHz.map((f) => {
        if (l.section) {
          const p = l.section.rlgcAt(f);
          return { fHz: f, R: Array.from(p.R), L: Array.from(p.L), G: Array.from(p.G), C: Array.from(p.C) };
        }
        return { fHz: f, R: Array.from(l.R), L: Array.from(l.L), G: Array.from(l.G), C: Array.from(l.C) };
      }),
    };
  });
}

function matrixLines(name: string, a: number[], n: number, unit: string): string[] {
  const out = [`    ${name} [${unit}]:`];
  for (let i = 0; i < n; i++) out.push(`      ${a.slice(i * n, i * n + n).map((x) => x.toPrecision(6).padStart(13)).join(' ')}`);
  return out;
}

/** Human-readable form of `lineParams`. */
export function formatParams(list: LineParams[]): string {
  const out: string[] = [];
  for (const p of list) {
    const n = p.conductors.length;
    out.push(`${p.id}: conductors ${p.conductors.join(', ')} (${p.origin})`);
    out.push(`  modal velocities: ${p.velocitiesMps.map((v) => `${formatQuantity(v, 'm/s')} (${(v / 299792458).toFixed(4)} c)`).join(', ')}`);
    out.push(...matrixLines('Zc', p.zcOhm, n, 'ohm').map((s) => s.slice(2)));
    out.push(...matrixLines('L (high frequency)', p.L.map((x) => x * 1e6), n, 'uH/m').map((s) => s.slice(2)));
    out.push(...matrixLines('C (high frequency)', p.C.map((x) => x * 1e12), n, 'pF/m').map((s) => s.slice(2)));
    for (const f of p.atFrequencies) {
      out.push(`  at ${formatQuantity(f.fHz, 'Hz')}:`);
      out.push(...matrixLines('R', f.R, n, 'ohm/m'), ...matrixLines('L', f.L.map((x) => x * 1e6), n, 'uH/m'));
      out.push(...matrixLines('G', f.G, n, 'S/m'), ...matrixLines('C', f.C.map((x) => x * 1e12), n, 'pF/m'));
    }
    out.push('');
  }
  return out.join('\n');
}
