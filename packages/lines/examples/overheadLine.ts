/**
 * Example: per-unit-length matrices of an invented 3-phase overhead line ("Hollow Creek feeder":
 * flat phase arrangement at 15 m, twin-bundle aluminium phase conductors, one earth wire on top,
 * 100 ohm*m earth). Run with: npx tsx packages/lines/examples/overheadLine.ts
 *
 * Caution: results are engineering estimates. Work on overhead lines and high-voltage systems
 * follows the applicable standards and local codes and is for qualified, licensed people.
 */
import { pathToFileURL } from 'node:url';
import { computeSection } from '../src/index.ts';
import type { LineSection } from '../src/index.ts';

/** The invented line: a plain object as the engine would pass it (SI units). */
export const hollowCreekFeeder = {
  kind: 'wires',
  ground: { resistivityOhmM: 100, model: 'carson' },
  wires: [
    { name: 'phaseA', x: -6, y: 15, radius: 0.0122, material: 'aluminium', bundle: { count: 2, spacing: 0.4 } },
    { name: 'phaseB', x: 0, y: 15, radius: 0.0122, material: 'aluminium', bundle: { count: 2, spacing: 0.4 } },
    { name: 'phaseC', x: 6, y: 15, radius: 0.0122, material: 'aluminium', bundle: { count: 2, spacing: 0.4 } },
    { name: 'earthWire', x: 0, y: 21, radius: 0.0055, material: { conductivity: 2.4e7 } },
  ],
} as const;

function matrix(title: string, a: Float64Array, n: number, scale: number, unit: string): string {
  const rows = [`${title} [${unit}]`];
  for (let i = 0; i < n; i++) {
    const cells: string[] = [];
    for (let j = 0; j < n; j++) cells.push((a[i * n + j] * scale).toFixed(5).padStart(11));
    rows.push(cells.join(' '));
  }
  return rows.join('\n');
}

/**
 * Computes the feeder's matrices and prints them.
 *
 * @param print where the text goes, default console.log
 * @returns the LineSection and the printed text
 * @example main(() => {}).section.n // 4
 */
export function main(print: (s: string) => void = console.log): { section: LineSection; text: string } {
  const s = computeSection(hollowCreekFeeder);
  const n = s.n;
  const out: string[] = [];
  out.push(`${s.describe}`);
  out.push(`conductors: ${s.conductors.join(', ')}`);
  out.push(matrix('L (high frequency, lossless)', s.L, n, 1e6, 'uH/m'));
  out.push(matrix('C', s.C, n, 1e12, 'pF/m'));
  for (const f of [0, 50, 1e3, 1e5, 1e6]) {
    const r = s.rlgcAt(f);
    out.push(`--- f = ${f} Hz`);
    out.push(matrix('R', r.R, n, 1e3, 'ohm/km'));
    out.push(matrix('L', r.L, n, 1e6, 'uH/m'));
  }
  out.push('Engineering estimates only: protection and clearances follow the applicable standards and local codes.');
  const text = out.join('\n');
  print(text);
  return { section: s, text };
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) main();
