import { describe, expect, it } from 'vitest';
import { axisLabel, axisTickFormat, formatTick, formatTickOwnPrefix, prefixExponent, prefixedUnit } from '../index.ts';

// Prefix names and powers: SI Brochure, 9th edition (BIPM 2019), table 7; "u" for micro as in
// core's unit parser.
describe('prefixExponent', () => {
  it('picks the power of 1000 at or below the largest magnitude', () => {
    expect(prefixExponent(2.5e-7)).toBe(-9);
    expect(prefixExponent(999e-9)).toBe(-9);
    expect(prefixExponent(1e-6)).toBe(-6);
    expect(prefixExponent(1500)).toBe(3);
    expect(prefixExponent(0.05)).toBe(-3);
    expect(prefixExponent(1)).toBe(0);
  });
  it('moves to the next prefix for values that would print as 1000', () => {
    expect(prefixExponent(999.8)).toBe(3);
  });
  it('gives 0 for zero and non-finite magnitudes', () => {
    expect(prefixExponent(0)).toBe(0);
    expect(prefixExponent(Number.NaN)).toBe(0);
    expect(prefixExponent(Infinity)).toBe(0);
  });
});

describe('formatTick', () => {
  it('prints the value in the axis prefix with the prefixed unit', () => {
    expect(formatTick(5e-8, 's', -9)).toBe('50 ns');
    expect(formatTick(2e-6, 's', -6)).toBe('2 us');
    expect(formatTick(-500, 'V', 3)).toBe('-0.5 kV');
    expect(formatTick(0.0125, 'J', -3)).toBe('12.5 mJ');
    expect(formatTick(0, 'A', 0)).toBe('0 A');
  });
  it('leaves binary noise out of the text', () => {
    expect(formatTick(3 * 1e-7, 's', -9)).toBe('300 ns');
  });
  it('does not prefix ratio and angle units', () => {
    expect(formatTick(-90, 'deg', 0)).toBe('-90 deg');
    expect(formatTick(-3, 'dB', 0)).toBe('-3 dB');
  });
});

describe('formatTickOwnPrefix', () => {
  it('gives each tick of a log axis its own prefix', () => {
    expect([1e4, 1e5, 1e6, 1e7].map((f) => formatTickOwnPrefix(f, 'Hz'))).toEqual(['10 kHz', '100 kHz', '1 MHz', '10 MHz']);
  });
});

describe('axisTickFormat', () => {
  it('uses one prefix for every tick of an axis', () => {
    const f = axisTickFormat([0, 2e-7], 's');
    expect([0, 5e-8, 1e-7, 2e-7].map(f)).toEqual(['0 ns', '50 ns', '100 ns', '200 ns']);
  });
});

describe('axisLabel', () => {
  it('puts the prefixed unit in brackets after the quantity', () => {
    expect(axisLabel('time', [0, 2e-7], 's')).toBe('time [ns]');
    expect(axisLabel('voltage', [-1200, 1200], 'V')).toBe('voltage [kV]');
    expect(prefixedUnit('m', 0)).toBe('m');
  });
});
