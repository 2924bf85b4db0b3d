/**
 * Touchstone files of S-parameters, after the open Touchstone File Format Specification (IBIS Open
 * Forum; version 1.1 and version 2.0, from memory): comment lines begin with `!`, the option line
 * `# <unit> S <format> R <ohm>`, then one record per frequency. Version 1 (`.sNp`) has one real
 * reference impedance for all ports and writes 2-port data in the order N11 N21 N12 N22; version 2
 * adds the keywords [Version], [Number of Ports], [Two-Port Data Order], [Number of Frequencies],
 * [Reference] (one impedance per port), [Network Data] and [End].
 */
import { badInput } from '@skein/core';
import { badTouchstone } from './errors.ts';
import type { SParameters } from './spectrum.ts';

/** Options of toTouchstone. */
export interface TouchstoneOptions {
  /** 1 (one reference impedance for all ports) or 2 (one per port). Default 2. */
  version?: 1 | 2;
  /** Number format: RI real/imaginary, MA magnitude/angle [deg], DB 20 log10 |S| / angle. Default RI. */
  format?: 'RI' | 'MA' | 'DB';
  /** Frequency unit of the file. Default Hz. */
  frequencyUnit?: 'Hz' | 'kHz' | 'MHz' | 'GHz';
  /** Comment lines written after `!` at the top. */
  comments?: string[];
}

const UNIT_SCALE = { Hz: 1, kHz: 1e3, MHz: 1e6, GHz: 1e9 } as const;

function fmt(x: number): string {
  return x.toPrecision(12).replace(/\.?0+e/, 'e').replace(/(\.\d*?)0+$/, '$1').replace(/\.$/, '');
}

/**
 * Writes S-parameters as a Touchstone file.
 * @param sp from solveSpectrum (`sParameters`); @param options version, format, unit, comments.
 * @returns the file text (a version 1 file is named `.sNp` with N the port count).
 * @throws InputError E_TOUCHSTONE_REFERENCE for version 1 when the ports' reference impedances differ.
 * @example toTouchstone(r.sParameters!, { version: 1 }) // "! ...\n# Hz S RI R 50\n1000 ..."
 */
export function toTouchstone(sp: SParameters, options: TouchstoneOptions = {}): string {
  const version = options.version ?? 2;
  const format = options.format ?? 'RI';
  const unit = options.frequencyUnit ?? 'Hz';
  const P = sp.ports.length;
  const refs = sp.ports.map((p) => p.referenceOhm);
  if (version === 1 && refs.some((r) => r !== refs[0])) {
    throw badInput(['ports'], 'must share one reference impedance for a Touchstone version 1 file (write version 2 for one per port)', refs, 'E_TOUCHSTONE_REFERENCE');
  }
  const lines: string[] = [];
  for (const c of options.comments ?? []) lines.push(`! ${c}`);
  lines.push(`! ports: ${sp.ports.map((p, i) => `${i + 1} = ${p.node} (${fmt(p.referenceOhm)} ohm)`).join(', ')}`);
  if (version === 2) lines.push('[Version] 2.0');
  lines.push(`# ${unit} S ${format} R ${fmt(refs[0] ?? 50)}`);
  if (version === 2) {
    lines.push(`[Number of Ports] ${P}`);
    if (P === 2) lines.push('[Two-Port Data Order] 21_12');
    lines.push(`[Number of Frequencies] ${sp.frequenciesHz.length}`);
    lines.push(`[Reference] ${refs.map(fmt).join(' ')}`);
    lines.push('[Network Data]');
  }
  const pair = (re: number, im: number): string => {
    if (format === 'RI') return `${fmt(re)} ${fmt(im)}`;
    const mag = Math.hypot(re, im);
    const ang = (Math.atan2(im, re) * 180) / Math.PI;
    return format === 'MA' ? `${fmt(mag)} ${fmt(ang)}` : `${fmt(20 * Math.log10(mag))} ${fmt(ang)}`;
  };
  sp.frequenciesHz.forEach((f, k) => {
    const at = (i: number, j: number): string => pair(sp.re[k * P * P + i * P + j], sp.im[k * P * P + i * P + j]);
    const fText = fmt(f / UNIT_SCALE[unit]);
    if (P === 1) lines.push(`${fText} ${at(0, 0)}`);
    else if (P === 2) lines.push(`${fText} ${at(0, 0)} ${at(1, 0)} ${at(0, 1)} ${at(1, 1)}`);
    else {
      // Each matrix row starts on a new line, at most four pairs per line.
      for (let i = 0; i < P; i++) {
        for (let j0 = 0; j0 < P; j0 += 4) {
          const cells: string[] = [];
          for (let j = j0; j < Math.min(P, j0 + 4); j++) cells.push(at(i, j));
          lines.push(`${i === 0 && j0 === 0 ? fText : ' '} ${cells.join(' ')}`);
        }
      }
    }
  });
  if (version === 2) lines.push('[End]');
  return `${lines.join('\n')}\n`;
}

/** A parsed Touchstone file. */
export interface TouchstoneData {
  version: 1 | 2;
  frequenciesHz: number[];
  /** Reference impedance per port [ohm]. */
  referenceOhm: number[];
  /** S entry (i, j) at frequency k at k*P*P + i*P + j. */
  re: Float64Array;
  im: Float64Array;
  ports: number;
}

/**
 * Reads a Touchstone S-parameter file (version 1 or 2; formats RI, MA, DB; Hz..GHz).
 * @param text file content; @param ports number of ports for a version 1 file (from its `.sNp` name).
 * @throws SkeinError E_TOUCHSTONE with the line number for malformed files.
 * @example parseTouchstone(toTouchstone(sp), 2).frequenciesHz
 */
export function parseTouchstone(text: string, ports?: number): TouchstoneData {
  const fail = (line: number, why: string): never => { throw badTouchstone(line, why); };
  let version: 1 | 2 = 1;
  let P = ports;
  // Version 1 defaults: GHz, MA, R 50 (the specification's defaults).
  let unit = 1e9;
  let format = 'MA';
  let refs: number[] | undefined;
  let r0 = 50;
  let inData = false;
  const numbers: number[] = [];
  const src = text.split(/\r?\n/);
  src.forEach((raw, li) => {
    const line = raw.replace(/!.*$/, '').trim();
    if (line === '') return;
    if (line.startsWith('[')) {
      const m = /^\[([^\]]+)\]\s*(.*)$/.exec(line);
      if (!m) return fail(li + 1, 'malformed keyword');
      const key = m[1].toLowerCase();
      const val = m[2];
      if (key === 'version') version = 2;
      else if (key === 'number of ports') P = Number(val);
      else if (key === 'reference') refs = val.split(/\s+/).map(Number);
      else if (key === 'network data') inData = true;
      else if (key === 'end') inData = false;
      else if (key === 'two-port data order' && val.trim() !== '21_12') fail(li + 1, `only [Two-Port Data Order] 21_12 is read, got ${val}`);
      return;
    }
    if (line.startsWith('#')) {
      const t = line.slice(1).trim().toUpperCase().split(/\s+/);
      for (let i = 0; i < t.length; i++) {
        const w = t[i];
        if (w === 'HZ') unit = 1; else if (w === 'KHZ') unit = 1e3; else if (w === 'MHZ') unit = 1e6; else if (w === 'GHZ') unit = 1e9;
        else if (w === 'RI' || w === 'MA' || w === 'DB') format = w;
        else if (w === 'R') r0 = Number(t[++i]);
        else if (w !== 'S') fail(li + 1, `only S-parameter files are read, option ${w}`);
      }
      return;
    }
    if (version === 2 && !inData) return;
    for (const tok of line.split(/\s+/)) {
      const x = Number(tok);
      if (!Number.isFinite(x)) fail(li + 1, `not a number: ${tok}`);
      numbers.push(x);
    }
  });
  if (!P || !(P >= 1)) return fail(0, 'number of ports unknown (give it for a version 1 file)');
  const per = 1 + 2 * P * P;
  if (numbers.length % per !== 0) fail(src.length, `${numbers.length} numbers are not whole records of ${per}`);
  const K = numbers.length / per;
  const re = new Float64Array(K * P * P);
  const im = new Float64Array(K * P * P);
  const frequenciesHz: number[] = [];
  for (let k = 0; k < K; k++) {
    frequenciesHz.push(numbers[k * per] * unit);
    for (let q = 0; q < P * P; q++) {
      let i = Math.floor(q / P);
      let j = q % P;
      if (P === 2) [i, j] = [j, i]; // N11 N21 N12 N22
      const a = numbers[k * per + 1 + 2 * q];
      const b = numbers[k * per + 2 + 2 * q];
      let x = a, y = b;
      if (format !== 'RI') {
        const mag = format === 'DB' ? Math.pow(10, a / 20) : a;
        x = mag * Math.cos((b * Math.PI) / 180);
        y = mag * Math.sin((b * Math.PI) / 180);
      }
      re[k * P * P + i * P + j] = x;
      im[k * P * P + i * P + j] = y;
    }
  }
  return { version, frequenciesHz, referenceOhm: refs ?? new Array<number>(P).fill(r0), re, im, ports: P };
}
