/**
 * Human-readable summaries of a run, a check and a results file.
 */
import { formatQuantity, type DelayInfo, type LoadedResults, type Plan, type RunResult } from '@skein/core';

/** The caution printed with every run and report. */
export const SAFETY_CAUTION =
  'Caution: results are engineering estimates. Surges, lightning and high voltage can kill. Protection design follows ' +
  'the applicable standards (such as IEC 62305 and IEC 61643) and local codes, and work on live or high-voltage ' +
  'systems is for qualified, licensed people.';

function table(rows: string[][]): string {
  const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => r[c].length)));
  return rows.map((r) => r.map((x, c) => x.padEnd(widths[c])).join('  ').trimEnd()).join('\n');
}

/** Summary of a finished run. */
export function formatRunSummary(r: RunResult, outPath: string | undefined): string {
  const lines: string[] = [];
  const nParts = r.network.junctions.reduce((a, j) => a + j.parts.length, 0);
  lines.push(`${r.title}`);
  lines.push(`  ${r.network.lines.length} lines, ${r.network.junctions.length} junctions, ${nParts} parts, ${r.network.probes.length} probes`);
  lines.push(`  time step ${formatQuantity(r.dtS, 's')}, ${r.nSteps} steps to ${formatQuantity(r.nSteps * r.dtS, 's')}, ${r.nSamples} samples recorded`);
  const phases = ['sources', 'switches', 'junctions', 'newton', 'parts', 'probes'].filter((k) => r.timing[k] > 0)
    .map((k) => `${k} ${formatQuantity(r.timing[k], 's', 3)}`).join(', ');
  lines.push(`  run time ${formatQuantity(r.timing.loop, 's', 3)} (compile ${formatQuantity(r.timing.compile, 's', 3)}; ${phases})`);
  if (r.peaks.length > 0) {
    lines.push('', 'Peaks:');
    const rows = [['trace', 'max', 'min', 'largest at']];
    for (const p of r.peaks) rows.push([p.trace, formatQuantity(p.max, p.unit), formatQuantity(p.min, p.unit), formatQuantity(p.atS, 's')]);
    lines.push(table(rows).replace(/^/gm, '  '));
  }
  if (r.ledger) {
    const l = r.ledger;
    lines.push('', 'Energy ledger at the end:');
    lines.push(`  delivered ${formatQuantity(l.deliveredJ, 'J')}, absorbed ${formatQuantity(l.absorbedJ, 'J')}, stored in lines ${formatQuantity(l.storedJ, 'J')}, ` +
      `residual ${l.residualJ.toExponential(2)} J (${l.deliveredJ !== 0 ? ((Math.abs(l.residualJ) / Math.abs(l.deliveredJ)) * 100).toExponential(1) : '0'} % of delivered)`);
  }
  const exceeded = r.warnings.filter((w) => w.includes('rating exceeded:'));
  if (exceeded.length > 0) {
    lines.push('', 'Devices whose rating was exceeded:');
    for (const w of exceeded) lines.push(`  - ${w}`);
  }
  const devices = Object.entries(r.outputs).filter(([k, v]) => k.startsWith('part:') && typeof (v as { energyJ?: unknown }).energyJ === 'number');
  if (devices.length > 0) {
    lines.push('', 'Devices:');
    const rows = [['part', 'energy', 'peak current', 'i2t']];
    for (const [k, v] of devices) {
      const d = v as { energyJ: number; peakCurrentA?: number; i2tA2s?: number };
      rows.push([k.slice(5), formatQuantity(d.energyJ, 'J'), d.peakCurrentA !== undefined ? formatQuantity(d.peakCurrentA, 'A') : '-', d.i2tA2s !== undefined ? formatQuantity(d.i2tA2s, 'A2s') : '-']);
    }
    lines.push(table(rows).replace(/^/gm, '  '));
  }
  const others = r.warnings.filter((w) => !w.includes('rating exceeded:'));
  if (others.length > 0) {
    lines.push('', 'Warnings:');
    for (const w of others) lines.push(`  - ${w}`);
  }
  if (outPath) lines.push('', `Results: ${outPath}`);
  lines.push('', SAFETY_CAUTION);
  return lines.join('\n');
}

/** Derived data of a compiled scenario, for `skein check`. */
export function formatCheck(plan: Plan): string {
  const sc = plan.scenario;
  const out: string[] = [];
  out.push(`${sc.title}: valid`);
  out.push(`  ${sc.lines.length} lines, ${sc.junctions.length} junctions, ${sc.probes.length} probes; digest ${sc.digest.slice(0, 16)}`);
  out.push(`  time step ${formatQuantity(plan.dtS, 's')} (${sc.time.stepS === undefined ? 'automatic' : 'set'}), ${plan.nSteps} steps, delays ${sc.time.delays}d`);
  out.push('', 'Lines:');
  sc.lines.forEach((l, i) => {
    const ml = plan.modal[i];
    out.push(`  ${l.id}: ${sc.junctions[l.from].id} -> ${sc.junctions[l.to].id}, ${formatQuantity(l.lengthM, 'm')}, conductors ${l.conductors.join(', ')} (${l.origin})`);
    const rows = [['mode', 'velocity', 'of c', 'Z mode', 'delay', 'steps', 'timing error', 'interp. loss']];
    plan.delays.filter((d) => d.line === l.id).forEach((d: DelayInfo) => {
      rows.push([String(d.mode), formatQuantity(d.velocityMps, 'm/s'), (d.velocityMps / 299792458).toFixed(4), formatQuantity(ml.Zm[d.mode - 1], 'ohm'),
        formatQuantity(d.delayS, 's'), (d.k + d.f).toFixed(3), formatQuantity(d.timingErrorS, 's'), `${(d.interpolationLoss * 100).toFixed(3)} %`]);
    });
    out.push(table(rows).replace(/^/gm, '    '));
    const fd = plan.fdLines.find((x) => x.line === i);
    if (fd) {
      const taus = fd.model.modes.map((m) => formatQuantity(m.tauS, 's')).join(', ');
      out.push(`    frequency-dependent: fitted delays ${taus}`);
      const c = fd.runCoupling;
      if (c) out.push(`    constant modal transformation at ${formatQuantity(fd.model.transform.fHz, 'Hz')}: neglected coupling up to ${(c.max * 100).toFixed(2)} % (modes ${c.modes[0]} and ${c.modes[1]}, at ${formatQuantity(c.atHz, 'Hz')}; band ${formatQuantity(c.bandHz[0], 'Hz')} to ${formatQuantity(c.bandHz[1], 'Hz')})`);
    }
    const n = ml.n;
    out.push('    Zc [ohm]:');
    for (let a = 0; a < n; a++) out.push(`      ${Array.from(ml.Zc.subarray(a * n, a * n + n), (z) => z.toFixed(3).padStart(10)).join(' ')}`);
  });
  if (plan.warnings.length > 0) {
    out.push('', 'Warnings:');
    for (const w of plan.warnings) out.push(`  - ${w}`);
  }
  return out.join('\n');
}

/** Summary of a results file, for `skein inspect`. */
export function formatInspect(r: LoadedResults, path: string): string {
  const d = r.doc;
  const out: string[] = [];
  out.push(`${path}: ${d.format} v${d.version}, written by ${d.engine.name} ${d.engine.version} at ${d.created}`);
  out.push(`  scenario "${d.scenario.title}"${d.scenario.file ? ` (${d.scenario.file})` : ''}, digest ${d.scenario.digest.slice(0, 16)}`);
  out.push(`  step ${formatQuantity(d.time.stepS, 's')}, ${d.time.count} samples every ${formatQuantity(d.time.sampleIntervalS, 's')}`);
  out.push(`  ${d.traces.shape[0]} traces (${d.traces.dtype}, ${d.traces.byteOrder}-endian):`);
  const rows = [['trace', 'unit', 'max', 'min']];
  d.traces.names.forEach((name, i) => {
    const row = r.trace(name);
    let mx = -Infinity;
    let mn = Infinity;
    for (let k = 0; k < row.length; k++) { if (row[k] > mx) mx = row[k]; if (row[k] < mn) mn = row[k]; }
    rows.push([name, d.traces.units[i], formatQuantity(mx, d.traces.units[i]), formatQuantity(mn, d.traces.units[i])]);
  });
  out.push(table(rows).replace(/^/gm, '    '));
  const outs = Object.keys(d.outputs);
  if (outs.length > 0) out.push(`  structured outputs: ${outs.join(', ')}`);
  if (d.summary.warnings.length > 0) out.push(`  warnings: ${d.summary.warnings.length}`);
  return out.join('\n');
}
