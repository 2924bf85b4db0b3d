import { existsSync, mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { encodeResults, InputError, SkeinError, writeFileAtomic } from '@skein/core';
import { writePlots, writeReport } from '../index.ts';
import { makeResults } from './fixtures.ts';
import { parseSvg } from './svgQuery.ts';

function resultsFile(): { dir: string; path: string } {
  const dir = mkdtempSync(join(tmpdir(), 'skein-report-'));
  const path = join(dir, 'feeder-run.msgpack');
  writeFileAtomic(path, encodeResults(makeResults().doc));
  return { dir, path };
}

describe('writePlots', () => {
  it('writes one parseable SVG per available plot, named after the results file', () => {
    const { dir, path } = resultsFile();
    const out = join(dir, 'plots', 'nested');
    const written = writePlots(path, out);
    expect(written.map((w) => w.kind)).toEqual(['traces', 'space-time', 'ledger', 'spectrum']);
    expect(readdirSync(out).sort()).toEqual(['feeder-run.ledger.svg', 'feeder-run.space-time.svg', 'feeder-run.spectrum.svg', 'feeder-run.traces.svg']);
    for (const w of written) {
      const text = readFileSync(w.path, 'utf8');
      expect(text.startsWith('<?xml version="1.0" encoding="UTF-8"?>')).toBe(true);
      expect(parseSvg(text).documentElement!.getAttribute('data-kind')).toBe(w.kind);
    }
  });

  it('leaves out plots set to false', () => {
    const { dir, path } = resultsFile();
    expect(writePlots(path, dir, { spaceTime: false, spectrum: false }).map((w) => w.kind)).toEqual(['traces', 'ledger']);
  });

  it('fails with the results error for a file that is not a results file', () => {
    const { dir } = resultsFile();
    const bad = join(dir, 'nope.msgpack');
    writeFileAtomic(bad, 'not msgpack at all');
    let err: unknown;
    try { writePlots(bad, dir); } catch (e) { err = e; }
    expect(err).toBeInstanceOf(SkeinError);
    expect((err as SkeinError).code).toBe('E_RESULTS');
    expect(existsSync(join(dir, 'nope.traces.svg'))).toBe(false);
  });
});

describe('writeReport', () => {
  it('writes the HTML report atomically and returns its path', () => {
    const { dir, path } = resultsFile();
    const html = join(dir, 'out', 'report.html');
    expect(writeReport(path, html)).toBe(html);
    const text = readFileSync(html, 'utf8');
    expect(text).toContain('results feeder-run.msgpack');
    expect(text).toContain('IEC 62305');
    expect(readdirSync(join(dir, 'out'))).toEqual(['report.html']); // no temporary file left
  });
});

describe('writePlots', () => {
  it('refuses results with a malformed structured output, naming its path', () => {
    const { dir } = resultsFile();
    const r = makeResults();
    r.doc.outputs.sweep = { kind: 'space-time', positionsM: [0, 1], values: [[0, 1], [2]], timesS: [0, 1] };
    let err: unknown;
    try { writePlots(r, dir); } catch (e) { err = e; }
    expect((err as InputError).code).toBe('E_REPORT_RESULTS');
    expect((err as InputError).path).toEqual(['outputs', 'sweep', 'values', 1]);
    expect(readdirSync(dir).filter((f) => f.endsWith('.svg'))).toEqual([]);
  });
});
