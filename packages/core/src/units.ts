/**
 * SI quantities written with prefixes and units ("2.5ns", "50ohm", "0.9uH/m", "10 ohm/km").
 * Parsing turns them into plain SI numbers; formatting prints engineering notation.
 */

/** The units a parameter can be given in, by their SI symbol. `1` is dimensionless. */
export type UnitSymbol =
  | '1' | 's' | 'Hz' | 'm' | 'V' | 'A' | 'ohm' | 'S' | 'F' | 'H' | 'W' | 'J' | 'K' | 'C'
  | 'H/m' | 'F/m' | 'ohm/m' | 'S/m' | 'ohm*m' | 'm/s' | 'V/s' | 'A/s' | 'J/K' | 'W/K' | 'A2s';

const PREFIX: Record<string, number> = {
  f: 1e-15, p: 1e-12, n: 1e-9, u: 1e-6, 'µ': 1e-6, 'μ': 1e-6, m: 1e-3, c: 1e-2, k: 1e3, M: 1e6, G: 1e9, T: 1e12,
};

const ALIASES: Record<string, string> = {
  Ω: 'ohm', ohms: 'ohm', Ohm: 'ohm', '': '',
  sec: 's',
};

/** Quantity names used in error messages ("must be a time"). */
const QUANTITY_NAME: Record<UnitSymbol, string> = {
  '1': 'number', s: 'time', Hz: 'frequency', m: 'length', V: 'voltage', A: 'current', ohm: 'resistance',
  S: 'conductance', F: 'capacitance', H: 'inductance', W: 'power', J: 'energy', K: 'temperature', C: 'charge',
  'H/m': 'inductance per metre', 'F/m': 'capacitance per metre', 'ohm/m': 'resistance per metre',
  'S/m': 'conductance per metre', 'ohm*m': 'resistivity', 'm/s': 'speed', 'V/s': 'voltage rate', 'A/s': 'current rate',
  'J/K': 'heat capacity', 'W/K': 'thermal conductance', A2s: 'action integral',
};

/** Example text for each unit, used in error messages. */
const EXAMPLE: Record<UnitSymbol, string> = {
  '1': '0.5', s: '2.5ns', Hz: '10MHz', m: '3.5m', V: '1.2kV', A: '10A', ohm: '50ohm', S: '20mS', F: '100pF', H: '0.9uH',
  W: '5W', J: '2J', K: '300K', C: '1uC', 'H/m': '0.25uH/m', 'F/m': '100pF/m', 'ohm/m': '10ohm/km', 'S/m': '1uS/m',
  'ohm*m': '100ohm*m', 'm/s': '2e8m/s', 'V/s': '1kV/us', 'A/s': '1kA/us', 'J/K': '0.02J/K', 'W/K': '1mW/K', A2s: '1A2s',
};

/** Human name of the quantity a unit measures ("time" for "s"). */
export function quantityName(unit: UnitSymbol): string {
  return QUANTITY_NAME[unit];
}

/** An example of a well-formed value for a unit ("2.5ns" for "s"). */
export function unitExample(unit: UnitSymbol): string {
  return EXAMPLE[unit];
}

const NUMBER_RE = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/;

function scaleOfUnitText(text: string, unit: UnitSymbol): number | undefined {
  const t = ALIASES[text] ?? text;
  if (t === '' ) return 1;
  if (unit === '1') return undefined;
  // Denominator forms: H/m, ohm/km, V/us, A/us.
  const slash = unit.indexOf('/');
  if (slash >= 0) {
    const [num, den] = [unit.slice(0, slash), unit.slice(slash + 1)];
    const ts = t.indexOf('/');
    if (ts < 0) return undefined;
    const a = scaleOf(t.slice(0, ts), num);
    const b = scaleOf(t.slice(ts + 1), den);
    return a === undefined || b === undefined ? undefined : a / b;
  }
  return scaleOf(t, unit);
}

function scaleOf(text: string, base: string): number | undefined {
  const t = ALIASES[text] ?? text;
  if (t === base) return 1;
  if (t.length > base.length && t.endsWith(base)) {
    const p = t.slice(0, t.length - base.length);
    const s = PREFIX[p];
    if (s !== undefined) return s;
  }
  return undefined;
}

/**
 * Parses a quantity into SI units.
 * @param value a number (already SI) or text like "2.5ns", "50 ohm", "0.9uH/m", "10ohm/km".
 * @param unit the SI unit the value must be in.
 * @returns the value in SI units, or `undefined` when the text is not a quantity of that unit.
 * @example parseQuantity('2.5ns', 's') // 2.5e-9
 */
export function parseQuantity(value: unknown, unit: UnitSymbol): number | undefined {
  if (typeof value === 'number') return Number.isFinite(value) ? value : undefined;
  if (typeof value !== 'string') return undefined;
  const m = NUMBER_RE.exec(value);
  if (!m) return undefined;
  const x = Number(m[1]);
  const scale = scaleOfUnitText(m[2].replace(/\s+/g, ''), unit);
  if (scale === undefined || !Number.isFinite(x)) return undefined;
  return x * scale;
}

const ENG: Array<[number, string]> = [
  [1e12, 'T'], [1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, 'u'], [1e-9, 'n'], [1e-12, 'p'], [1e-15, 'f'],
];

/**
 * Formats an SI value in engineering notation with a prefix.
 * @example formatQuantity(2.5e-9, 's') // "2.5 ns"
 */
export function formatQuantity(value: number, unit: string, digits = 4): string {
  if (!Number.isFinite(value)) return `${value} ${unit}`;
  if (value === 0) return `0 ${unit}`;
  const a = Math.abs(value);
  const perUnit = unit.includes('/') || unit === '1' || unit === '';
  if (perUnit) return `${Number(value.toPrecision(digits))} ${unit}`.trim();
  for (const [s, p] of ENG) {
    if (a >= s * 0.9995) return `${Number((value / s).toPrecision(digits))} ${p}${unit}`;
  }
  return `${value.toExponential(digits - 1)} ${unit}`;
}

const ANY_UNITS: UnitSymbol[] = ['m', 's', 'Hz', 'V', 'A', 'ohm', 'S', 'F', 'H', 'W', 'J', 'K', 'C', 'H/m', 'F/m', 'ohm/m', 'S/m', 'ohm*m', 'm/s'];

/**
 * Parses text carrying any known unit ("2cm", "100ohm*m", "5.8e7S/m") to its SI value, or returns
 * undefined when the text is not a quantity. Plain numbers pass through.
 * @example parseAnyQuantity('2cm') // 0.02
 */
export function parseAnyQuantity(value: unknown): number | undefined {
  if (typeof value === 'number') return Number.isFinite(value) ? value : undefined;
  if (typeof value !== 'string') return undefined;
  for (const u of ANY_UNITS) {
    const x = parseQuantity(value, u);
    if (x !== undefined && /[A-Za-zΩµμ]/.test(value)) return x;
  }
  const plain = parseQuantity(value, '1');
  return plain;
}
