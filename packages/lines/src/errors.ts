/**
 * Errors of the lines package. Every bad input becomes a {@link SectionError} built by one helper
 * ({@link sectionError}), so the value printed is the value checked.
 */

/** Stable error codes. */
export type SectionErrorCode =
  | 'SECTION_TYPE'
  | 'SECTION_REQUIRED'
  | 'SECTION_UNKNOWN_KEY'
  | 'SECTION_ENUM'
  | 'SECTION_NOT_FINITE'
  | 'SECTION_NOT_POSITIVE'
  | 'SECTION_NEGATIVE'
  | 'SECTION_RANGE'
  | 'SECTION_ORDER'
  | 'SECTION_OVERLAP'
  | 'SECTION_BELOW_GROUND'
  | 'SECTION_DUPLICATE_NAME'
  | 'SECTION_REFERENCE'
  | 'SECTION_UNSUPPORTED'
  | 'SECTION_FREQUENCY'
  | 'SECTION_NOT_CONTINUABLE';

/** A path inside the section object, e.g. ['wires', 1, 'radius']. */
export type SectionPath = (string | number)[];

/**
 * Formats a path as text: ['wires', 1, 'radius'] -> "wires[1].radius"; [] -> "section".
 *
 * @param path path inside the section object
 * @returns the printed path
 * @example formatPath(['wires', 1, 'radius']) // "wires[1].radius"
 */
export function formatPath(path: SectionPath): string {
  if (path.length === 0) return 'section';
  let s = '';
  for (const p of path) {
    if (typeof p === 'number') s += `[${p}]`;
    else s += s === '' ? p : `.${p}`;
  }
  return s;
}

function formatValue(value: unknown, unit: string | undefined): string {
  if (value === undefined) return 'nothing';
  if (typeof value === 'number') return unit ? `${value} ${unit}` : String(value);
  if (typeof value === 'string') return JSON.stringify(value);
  try {
    return JSON.stringify(value) ?? String(value);
  } catch {
    return String(value);
  }
}

/**
 * A bad cross-section input: which field (path), what was expected (rule), what was found (value).
 *
 * @example
 * try { computeSection({ kind: 'coax', innerRadius: -1 }) } catch (e) { (e as SectionError).code } // 'SECTION_NOT_POSITIVE'
 */
export class SectionError extends Error {
  /** Stable code, e.g. 'SECTION_OVERLAP'. */
  readonly code: SectionErrorCode;
  /** Path inside the section object. */
  readonly path: SectionPath;
  /** What was expected, e.g. "must be a positive length". */
  readonly rule: string;
  /** The value found (undefined when missing). */
  readonly value: unknown;

  constructor(code: SectionErrorCode, path: SectionPath, rule: string, value: unknown, unit?: string) {
    super(`${formatPath(path)}: ${rule}, got ${formatValue(value, unit)}`);
    this.name = 'SectionError';
    this.code = code;
    this.path = [...path];
    this.rule = rule;
    this.value = value;
  }
}

/**
 * The one helper that makes bad-input errors.
 *
 * @param code stable code
 * @param path path inside the section
 * @param rule what was expected ("must be a positive length")
 * @param value what was found
 * @param unit unit printed after a numeric value, e.g. 'm'
 * @returns the error (throw it)
 * @example sectionError('SECTION_NOT_POSITIVE', ['wires', 1, 'radius'], 'must be a positive length', -0.002, 'm').message
 * // "wires[1].radius: must be a positive length, got -0.002 m"
 */
export function sectionError(code: SectionErrorCode, path: SectionPath, rule: string, value: unknown, unit?: string): SectionError {
  return new SectionError(code, path, rule, value, unit);
}
