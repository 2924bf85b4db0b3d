/**
 * CSV export of a results file: one column of time, one per trace, header "name [unit]".
 */
import type { LoadedResults } from '@skein/core';

/** The traces as CSV text (full float64 precision, shortest round-trip form). */
export function toCsv(r: LoadedResults): string {
  const names = r.doc.traces.names;
  const units = r.doc.traces.units;
  const cols = names.map((n) => r.trace(n));
  const head = ['time [s]', ...names.map((n, i) => `${n} [${units[i]}]`)].map((h) => (/[",]/.test(h) ? `"${h.replace(/"/g, '""')}"` : h));
  const out: string[] = [head.join(',')];
  for (let i = 0; i < r.time.length; i++) {
    const row = [String(r.time[i])];
    for (const c of cols) row.push(String(c[i]));
    out.push(row.join(','));
  }
  return `${out.join('\n')}\n`;
}
