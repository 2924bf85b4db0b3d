/**
 * The conformance report: plain data, so it crosses the worker boundary by structured clone.
 */
import { SkeinError } from '../errors.ts';

/** One named check of the conformance suite. */
export interface ConformanceCheck {
  /** Stable name of the check: `loads-in-worker`, `plugin-shape`, `param-schema`, `create`, `no-step-allocation`, `no-shared-state`, `finish-after-failure`, `step-values`. */
  name: string;
  /** Plugin type the check is about (absent for module-level checks). */
  plugin?: string;
  ok: boolean;
  /** What was found (on success too: the measured figure where there is one). */
  message: string;
}

/** Result of running the suite over one plugin module. */
export interface ConformanceReport {
  /** The specifier as given. */
  specifier: string;
  /** The URL it resolved to, when it resolved. */
  url?: string;
  /** `kind:type` of every plugin in the module's default export, in order. */
  plugins: string[];
  checks: ConformanceCheck[];
  /** True when every check passed. */
  ok: boolean;
}

/** Formats the failed checks of a report, one per line. */
export function formatConformanceFailures(report: ConformanceReport): string {
  return report.checks
    .filter((c) => !c.ok)
    .map((c) => `  ${c.plugin ? `${c.plugin}: ` : ''}${c.name}: ${c.message}`)
    .join('\n');
}

/**
 * The error of a module that fails the suite (code E_CONFORMANCE), details carry the report.
 * @example throw conformanceFailed(report)
 */
export function conformanceFailed(report: ConformanceReport): SkeinError {
  const failed = report.checks.filter((c) => !c.ok).length;
  return new SkeinError(
    'E_CONFORMANCE',
    `plugin module ${report.specifier} fails ${failed} of ${report.checks.length} conformance checks:\n${formatConformanceFailures(report)}`,
    { report },
  );
}
