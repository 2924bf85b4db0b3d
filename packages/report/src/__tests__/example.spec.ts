import { existsSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { encodeResults, writeFileAtomic } from '@skein/core';
import { plotResults } from '../../examples/plotResults.ts';
import { makeResults } from './fixtures.ts';

describe('writeReport', () => {
  it('serves the plotResults example: four SVGs and a report from one results file', () => {
    const dir = mkdtempSync(join(tmpdir(), 'skein-report-example-'));
    const results = join(dir, 'harness.msgpack');
    writeFileAtomic(results, encodeResults(makeResults().doc));
    const paths = plotResults(results, join(dir, 'plots'));
    expect(paths.map((p) => p.slice(dir.length + 1))).toEqual([
      'plots/harness.traces.svg', 'plots/harness.space-time.svg', 'plots/harness.ledger.svg', 'plots/harness.spectrum.svg', 'plots/harness.report.html',
    ]);
    expect(paths.every((p) => existsSync(p))).toBe(true);
  });
});
