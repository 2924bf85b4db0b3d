import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('../../../../', import.meta.url));

describe('examples', () => {
  it('runs measureWaveforms and prints one line per waveform with the figures of the README', () => {
    const out = execFileSync(process.execPath, ['--import', 'tsx', 'plugins/surge-waveforms/examples/measureWaveforms.ts'], { cwd: root, encoding: 'utf8' });
    const lines = out.trim().split('\n');
    expect(lines).toHaveLength(9);
    expect(lines[0]).toMatch(/T1 1\.202 us .* T2 50\.00\d us/);
    expect(lines[1]).toMatch(/T1 8\.023 us .* T2 19\.93\d us/);
    expect(lines[2]).toMatch(/Q 100\.23 C, W\/R 10\.27\d MJ\/ohm/);
  }, 60_000);
});
