/**
 * Engineering scales: an axis picks one SI prefix (a power of 1000) from the largest magnitude it
 * shows, and every tick label carries that prefix and the unit ("0 ns", "50 ns", "100 ns").
 * Prefixes: SI Brochure, 9th edition (BIPM 2019), table 7. "u" stands for micro, as in core's
 * unit parser, so that labels stay plain ASCII.
 */

const PREFIXES: ReadonlyArray<[number, string]> = [
  [-18, 'a'], [-15, 'f'], [-12, 'p'], [-9, 'n'], [-6, 'u'], [-3, 'm'], [0, ''], [3, 'k'], [6, 'M'], [9, 'G'], [12, 'T'], [15, 'P'],
];

/** Units that take no prefix (ratios, levels, angles). */
const UNPREFIXED = new Set(['dB', 'deg', '%', '1', '']);

/**
 * The exponent (multiple of 3, from -18 to 15) of the prefix for values up to `maxAbs`.
 * @param maxAbs largest magnitude on the axis (0 or non-finite gives 0)
 * @example prefixExponent(2.5e-7) // -9 (ns, so 250 ns)
 */
export function prefixExponent(maxAbs: number): number {
  if (!(maxAbs > 0) || !Number.isFinite(maxAbs)) return 0;
  // 0.9995 so that 999.7 rounds into the next prefix rather than printing "1000 m".
  const e = 3 * Math.floor(Math.log10(maxAbs / 0.9995) / 3);
  return Math.min(15, Math.max(-18, e));
}

/**
 * The prefix letter of an exponent from prefixExponent.
 * @example prefixOf(-6) // "u"
 */
export function prefixOf(exponent: number): string {
  const p = PREFIXES.find(([e]) => e === exponent);
  return p ? p[1] : `e${exponent} `;
}

/**
 * The unit with the axis prefix ("ns", "kV"); units that take no prefix come back unchanged.
 * @example prefixedUnit('V', 3) // "kV"
 */
export function prefixedUnit(unit: string, exponent: number): string {
  return UNPREFIXED.has(unit) ? unit : `${prefixOf(exponent)}${unit}`;
}

/**
 * Number text without binary noise: at most `digits` significant digits, no trailing zeros.
 * @example cleanNumber(0.1 + 0.2) // "0.3"
 */
export function cleanNumber(x: number, digits = 6): string {
  if (x === 0 || Object.is(x, -0)) return '0';
  return String(Number(x.toPrecision(digits)));
}

/**
 * A tick label with a fixed prefix: `value` in base units shown as value / 10^exponent.
 * @param value [unit]
 * @param unit base unit ("s", "V")
 * @param exponent from prefixExponent of the axis
 * @example formatTick(5e-8, 's', -9) // "50 ns"
 */
export function formatTick(value: number, unit: string, exponent: number): string {
  if (UNPREFIXED.has(unit)) return `${cleanNumber(value)}${unit === '' || unit === '1' ? '' : ` ${unit}`}`;
  return `${cleanNumber(value / 10 ** exponent)} ${prefixedUnit(unit, exponent)}`;
}

/**
 * A tick label with its own prefix (for log axes spanning decades).
 * @example formatTickOwnPrefix(2e6, 'Hz') // "2 MHz"
 */
export function formatTickOwnPrefix(value: number, unit: string): string {
  return formatTick(value, unit, prefixExponent(Math.abs(value)));
}

/**
 * A tick formatter for an axis whose domain is [lo, hi], for Plot's `tickFormat`.
 * @example axisTickFormat([0, 2e-7], 's')(1e-7) // "100 ns"
 */
export function axisTickFormat(domain: readonly [number, number], unit: string): (v: number) => string {
  const e = prefixExponent(Math.max(Math.abs(domain[0]), Math.abs(domain[1])));
  return (v: number) => formatTick(v, unit, e);
}

/**
 * Axis label text: quantity and prefixed unit, "time [ns]".
 * @example axisLabel('time', [0, 2e-7], 's') // "time [ns]"
 */
export function axisLabel(quantity: string, domain: readonly [number, number], unit: string): string {
  const u = prefixedUnit(unit, prefixExponent(Math.max(Math.abs(domain[0]), Math.abs(domain[1]))));
  return u === '' || u === '1' ? quantity : `${quantity} [${u}]`;
}
