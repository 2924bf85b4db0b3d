import { describe, expect, it } from 'vitest';
import { createSweepProgress, formatProgress } from '../index.ts';

describe('formatProgress', () => {
  it('shows the bar, the cases done, the failures and the ETA', () => {
    expect(formatProgress({ done: 50, total: 200, computed: 50, failed: 1, etaS: 12 }, 8)).toBe('[##......] 50/200 cases, 1 failed, eta 12.0 s');
    expect(formatProgress({ done: 0, total: 10, computed: 0, failed: 0, etaS: NaN }, 4)).toBe('[....] 0/10 cases, 0 failed, eta -');
  });
});

describe('createSweepProgress', () => {
  it('prints one line per tenth of the way when the stream is not a terminal', () => {
    const lines: string[] = [];
    const bar = createSweepProgress((s) => lines.push(s), false);
    for (let done = 0; done <= 100; done++) bar.update({ done, total: 100, computed: done, failed: 0, etaS: (100 - done) / 10 });
    bar.done();
    expect(lines).toHaveLength(11);
    expect(lines[10]).toContain('100/100 cases');
  });

  it('redraws one line on a terminal and ends it with a newline', () => {
    let text = '';
    const bar = createSweepProgress((s) => (text += s), true);
    bar.update({ done: 1, total: 2, computed: 1, failed: 0, etaS: 1 });
    bar.update({ done: 2, total: 2, computed: 2, failed: 0, etaS: 0 });
    bar.done();
    expect(text.startsWith('\rsweep [')).toBe(true);
    expect(text.endsWith('\n')).toBe(true);
    expect(text).toContain('2/2 cases');
  });
});
