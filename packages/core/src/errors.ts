/**
 * Every error skein raises. Each has a stable `code` and comes from a named factory below, so a
 * caller can branch on `err.code` and a test can assert the fields instead of matching text.
 */

/** Where in a scenario file a problem sits. Line and column are 1-based. */
export interface SourceLocation {
  file?: string;
  line?: number;
  column?: number;
}

/** A path inside a parsed document: object keys and array indices. */
export type DocPath = ReadonlyArray<string | number>;

/** Formats a document path as `lines[0].length` or `junctions.J1.nodes.a`. */
export function formatPath(path: DocPath): string {
  let out = '';
  for (const p of path) {
    if (typeof p === 'number') out += `[${p}]`;
    else if (/^[A-Za-z_][\w-]*$/.test(p)) out += out === '' ? p : `.${p}`;
    else out += `[${JSON.stringify(p)}]`;
  }
  return out === '' ? '(document root)' : out;
}

/** Base class of every skein error. `code` is stable across versions; `details` are plain data. */
export class SkeinError extends Error {
  readonly code: string;
  readonly details: Readonly<Record<string, unknown>>;
  constructor(code: string, message: string, details: Record<string, unknown> = {}, options?: { cause?: unknown }) {
    super(message, options);
    this.name = 'SkeinError';
    this.code = code;
    this.details = details;
  }
}

/**
 * Bad input: a value in a scenario (or API input) that breaks a rule. The message prints the very
 * value that was checked, the rule, and where it sits.
 */
export class InputError extends SkeinError {
  readonly path: DocPath;
  readonly rule: string;
  readonly value: unknown;
  readonly location: SourceLocation;
  constructor(code: string, path: DocPath, rule: string, value: unknown, location: SourceLocation = {}) {
    super(code, formatInputMessage(path, rule, value, location), { path: [...path], rule, value, ...location });
    this.name = 'InputError';
    this.path = path;
    this.rule = rule;
    this.value = value;
    this.location = location;
  }
}

function describeValue(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (typeof value === 'string') return JSON.stringify(value);
  if (typeof value === 'number') return String(value);
  try {
    const s = JSON.stringify(value);
    return s.length > 80 ? `${s.slice(0, 77)}...` : s;
  } catch {
    return String(value);
  }
}

function formatInputMessage(path: DocPath, rule: string, value: unknown, loc: SourceLocation): string {
  const where: string[] = [];
  if (loc.file) where.push(loc.file);
  if (loc.line !== undefined) where.push(`line ${loc.line}${loc.column !== undefined ? `, column ${loc.column}` : ''}`);
  const suffix = where.length > 0 ? ` (${where.join(', ')})` : '';
  return `${formatPath(path)}: ${rule}, got ${describeValue(value)}${suffix}`;
}

/** Factory for bad input. `rule` says what would be right ("must be a positive length"). */
export function badInput(path: DocPath, rule: string, value: unknown, code = 'E_INPUT', location: SourceLocation = {}): InputError {
  return new InputError(code, path, rule, value, location);
}

/** The scenario text could not be parsed at all (YAML / JSON syntax). */
export function syntaxError(file: string | undefined, message: string, line?: number, column?: number): InputError {
  return new InputError('E_SYNTAX', [], `is not valid YAML or JSON: ${message}`, undefined, { file, line, column });
}

/** A numerical condition found by the orchestration (singular junction, unstable step). */
export class NumericalError extends SkeinError {
  constructor(code: string, message: string, details: Record<string, unknown> = {}) {
    super(code, message, details);
    this.name = 'NumericalError';
  }
}

/** A junction's nodal matrix is singular: some node has no path to the reference. */
export function singularJunction(junction: string, detail: string): NumericalError {
  return new NumericalError(
    'E_SINGULAR_JUNCTION',
    `junction ${junction}: its nodal system is singular (${detail}); every node needs a path to the reference through a line, a part or a source with finite resistance`,
    { junction },
  );
}

/** A value turned non-finite during stepping. */
export function nonFinite(step: number, timeS: number, place: string): NumericalError {
  return new NumericalError(
    'E_NON_FINITE',
    `the solution became non-finite at step ${step} (t = ${timeS.toExponential(4)} s) at ${place}; check part values and the time step`,
    { step, timeS, place },
  );
}

/** An error thrown inside a plugin hook, wrapped with engine context; the original stays as `cause`. */
export class PluginError extends SkeinError {
  readonly plugin: string;
  readonly hook: string;
  constructor(plugin: string, hook: string, cause: unknown, context: { step?: number; timeS?: number; part?: string } = {}) {
    const inner = cause instanceof Error ? cause.message : String(cause);
    const innerCode = cause instanceof SkeinError ? cause.code : (cause as { code?: unknown } | null)?.code;
    const at = context.step !== undefined ? ` at step ${context.step} (t = ${(context.timeS ?? 0).toExponential(4)} s)` : '';
    super('E_PLUGIN', `plugin ${plugin}, hook ${hook}${context.part ? `, part ${context.part}` : ''}${at}: ${inner}`, {
      plugin,
      hook,
      pluginCode: typeof innerCode === 'string' ? innerCode : undefined,
      ...context,
    }, { cause });
    this.name = 'PluginError';
    this.plugin = plugin;
    this.hook = hook;
    if (cause instanceof Error && cause.stack) this.stack = `${this.stack}\nCaused by: ${cause.stack}`;
  }
}

/** Two plugin modules register the same type name. */
export function duplicatePlugin(kind: string, type: string, first: string, second: string): SkeinError {
  return new SkeinError('E_PLUGIN_DUPLICATE', `${kind} type "${type}" is registered twice: by ${first} and by ${second}`, {
    kind,
    type,
    first,
    second,
  });
}

/** A plugin module could not be loaded or does not export a plugin. */
export function pluginLoadFailed(specifier: string, reason: string, cause?: unknown): SkeinError {
  return new SkeinError('E_PLUGIN_LOAD', `plugin module ${specifier}: ${reason}`, { specifier }, { cause });
}

/** An internal invariant broke: a bug in skein, never the user's fault. */
export function bug(message: string): SkeinError {
  return new SkeinError('E_BUG', `bug: ${message}`);
}

/** A results file is not one skein can read. */
export function badResults(file: string, reason: string): SkeinError {
  return new SkeinError('E_RESULTS', `${file}: not a readable skein results file: ${reason}`, { file });
}
