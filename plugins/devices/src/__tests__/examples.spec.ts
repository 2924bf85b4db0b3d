import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('../../../../', import.meta.url));

describe('examples', () => {
  it('runs surgeIntoVaristor: the clamp voltage follows the varistor law at the peak current and the energy rating warning appears', () => {
    const out = execFileSync(process.execPath, ['--import', 'tsx', 'plugins/devices/examples/surgeIntoVaristor.ts'], { cwd: root, encoding: 'utf8' });
    const res = JSON.parse(out.split('\n')[1]) as { energyJ: number; peakCurrentA: number; peakVoltageV: number };
    // Consistency with the varistor law: at the peak current the voltage is Vref (I/Iref)^(1/alpha)
    // = 470 (1621.5/1e-3)^(1/30) = 756.9 V (closed form of the power law); 1e-3 for the time grid.
    expect(Math.abs(res.peakVoltageV - 470 * Math.pow(res.peakCurrentA / 1e-3, 1 / 30)) / res.peakVoltageV).toBeLessThan(1e-3);
    // Source side: the current cannot exceed Voc/2 ohm = 2 kA.
    expect(res.peakCurrentA).toBeLessThan(2000);
    expect(out).toMatch(/rating exceeded: MOV1 \(varistor\) energy/);
  });
});
