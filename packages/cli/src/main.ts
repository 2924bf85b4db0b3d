/**
 * The `skein` command. Exit codes: 0 success, 2 bad input (nothing written), 1 any other failure.
 */
import { existsSync, readFileSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { parseArgs } from 'node:util';
import {
  compileScenario, InputError, runPartitioned, loadPluginModules, PluginRegistry, readResults, resolveScenarioText, runPlan, scenarioSchema,
  SkeinError, writeFileAtomic, writeResults, encodeResults, type Plan, type ResolvedScenario,
} from '@skein/core';
import { createProgress } from './progress.ts';
import { STANDARD_PLUGINS, STANDARD_PLUGINS_BASE } from './standardPlugins.ts';
import { formatCheck, formatInspect, formatRunSummary } from './summary.ts';
import { toCsv } from './export.ts';
import { formatParams, lineParams, parseFrequencies } from './params.ts';
import { sectionSchema } from '@skein/lines';
import { writePlots, writeReport } from '@skein/report';
import { parseSpectrumArgs, runSpectrumCommand } from '@skein/spectral';
import { sweepCommand } from '@skein/sweep';
import { spectralResultsDocument } from './spectralResults.ts';

const HERE = dirname(fileURLToPath(import.meta.url));
/** The built-in demo scenario. */
export const DEMO_SCENARIO = join(HERE, 'demo', 'harness.yaml');

const USAGE = `skein: pulses in wire networks

usage: skein <command> [options]

commands:
  run FILE [--out PATH] [--report] [--threads N]
                               simulate a scenario (YAML or JSON), write a results file
                               (and with --report the SVG plots and the HTML report beside it;
                               --threads N partitions the network over N worker threads)
  check FILE [--json]          validate a scenario and print derived data (modes, Zc, delays, step)
  demo [--out DIR]             run the built-in demo scenario, write its results and report
  inspect RESULTS              summarise a results file
  plot RESULTS [--out DIR]     SVG plots: traces, space-time map, energy ledger, spectra
  report RESULTS [--out PATH]  one self-contained HTML report (opens offline)
  export RESULTS --csv [--out PATH]
                               write the traces as CSV (stdout without --out)
  params FILE [--at F1,F2..] [--json]
                               per-unit-length R, L, G, C of every line at the given
                               frequencies (default 0,50Hz,1MHz,100MHz), Zc, modal velocities
  schema [--section]           print the scenario JSON Schema (or the cross-section schema)
  sweep SWEEP.yaml [--workers N] [--shard K/N] [--queue URL | --worker-of URL] ...
                               many cases of a base scenario (see packages/sweep/README.md)
  spectrum FILE --from F --to F [--points N] [--log] [--out v(J.n)]... [--port J.n:50ohm]...
           [--touchstone FILE.s2p] [--touchstone-version 1|2] [--format RI|MA|DB] [--results PATH]
                               the exact frequency-domain solution: node voltages, currents,
                               transfer functions h(J.b/J.a), impedances z(J.n), S-parameters
                               between ports (Touchstone); results in FILE.spectrum.msgpack
  spectrum FILE --until T --every DT [--inversion fourier|laplace] [--aliasing 1e-10] [--fmax F]
           [--out v(J.n) | i(line.end)]...
                               time response from the spectrum (reference for the transient
                               solver): 'fourier' sums the series on the j omega axis, doubling
                               the period until the wrap-around is below 1e-6; 'laplace' is the
                               numerical Laplace transform, one pass damped by sigma =
                               ln(1/aliasing)/period (every load needs admittanceAt); table on
                               stdout, traces in FILE.spectrum.msgpack

options for every command that reads a scenario:
  --plugin SPEC                also load this plugin module (repeatable)
  --config PATH                a JSON configuration file with { "plugins": [...] }
                               (default: ./skein.config.json when it exists)
  --quiet                      no progress output
`;

interface Io {
  out: (s: string) => void;
  err: (s: string) => void;
}

const defaultIo: Io = {
  out: (s) => process.stdout.write(s.endsWith('\n') ? s : `${s}\n`),
  err: (s) => process.stderr.write(s.endsWith('\n') ? s : `${s}\n`),
};

/** A frequency-dependent line's fitted delays and its transformation's neglected coupling, for `skein check --json`. */
function fdCheckInfo(plan: Plan, line: number): Record<string, unknown> {
  const fd = plan.fdLines.find((x) => x.line === line);
  if (!fd) return {};
  return {
    frequencyDependent: {
      fittedDelaysS: fd.model.modes.map((m) => m.tauS),
      modalFrequencyHz: fd.n > 1 ? fd.model.transform.fHz : undefined,
      neglectedCoupling: fd.runCoupling,
    },
  };
}

/**
 * Builds the plugin registry: the standard set, then the configuration's plugins, then --plugin flags.
 * @throws SkeinError E_PLUGIN_LOAD, E_PLUGIN_DUPLICATE, E_CONFIG.
 */
export async function buildRegistry(flags: { plugin?: string[]; config?: string }): Promise<PluginRegistry> {
  const registry = new PluginRegistry();
  await loadPluginModules(registry, STANDARD_PLUGINS, STANDARD_PLUGINS_BASE);
  const configPath = flags.config ?? (existsSync('skein.config.json') ? 'skein.config.json' : undefined);
  if (configPath) {
    let cfg: unknown;
    try {
      cfg = JSON.parse(readFileSync(configPath, 'utf8'));
    } catch (e) {
      throw new SkeinError('E_CONFIG', `${configPath}: cannot read the configuration: ${(e as Error).message}`, { file: configPath });
    }
    const plugins = (cfg as { plugins?: unknown }).plugins;
    if (plugins !== undefined && (!Array.isArray(plugins) || plugins.some((p) => typeof p !== 'string'))) {
      throw new SkeinError('E_CONFIG', `${configPath}: "plugins" must be a list of module specifiers`, { file: configPath });
    }
    await loadPluginModules(registry, (plugins as string[] | undefined) ?? [], pathToFileURL(resolve(configPath)).href);
  }
  await loadPluginModules(registry, flags.plugin ?? [], pathToFileURL(`${process.cwd()}/`).href);
  return registry;
}

function readScenario(file: string, registry: PluginRegistry): ResolvedScenario {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (e) {
    throw new InputError('E_FILE', [], `must be a readable scenario file (${(e as NodeJS.ErrnoException).code ?? 'error'})`, file, { file });
  }
  return resolveScenarioText(text, { registry, file });
}

/** Default results path: next to the scenario, same base name. */
export function defaultResultsPath(scenarioFile: string): string {
  const base = basename(scenarioFile).replace(/\.(ya?ml|json)$/i, '');
  return join(dirname(scenarioFile), `${base}.results.msgpack`);
}

async function runFile(file: string, outPath: string, flags: Flags, io: Io): Promise<void> {
  const registry = await buildRegistry(flags);
  const t0 = performance.now();
  const threads = flags.threads === undefined ? 1 : Number(flags.threads);
  if (!Number.isInteger(threads) || threads < 1) throw new InputError('E_USAGE', ['--threads'], 'must be a whole number of threads, at least 1', flags.threads);
  const progress = createProgress(`running ${basename(file)}`, process.stderr, flags.quiet);
  let result;
  if (threads > 1) {
    const scenario = readScenario(file, registry);
    result = await runPartitioned({ text: readFileSync(file, 'utf8'), file, scenario }, { registry, threads, onProgress: (f) => progress.update(f) });
  } else {
    const sc = readScenario(file, registry);
    const plan = await compileScenario(sc, { registry });
    const compileS = (performance.now() - t0) / 1000;
    result = await runPlan(plan, { registry, onProgress: (f) => progress.update(f) }, compileS);
  }
  progress.done();
  writeResults(outPath, result, file);
  io.out(formatRunSummary(result, outPath));
  if (flags.report) writeReportFiles(outPath, io);
}

/** Plots and the HTML report beside a results file; prints their paths. */
function writeReportFiles(resultsPath: string, io: Io): string {
  const loaded = readResults(resultsPath);
  const dir = dirname(resultsPath);
  const plots = writePlots(resultsPath, dir, {});
  const html = writeReport(loaded, resultsPath.replace(/\.msgpack$/, '') + '.report.html', { resultsFile: basename(resultsPath) });
  io.out(`Plots: ${plots.map((p) => p.path).join(', ')}`);
  io.out(`Report: ${html}`);
  return html;
}

interface Flags {
  out?: string;
  plugin?: string[];
  config?: string;
  quiet?: boolean;
  json?: boolean;
  csv?: boolean;
  report?: boolean;
  threads?: string;
  help?: boolean;
  at?: string;
  section?: boolean;
}

/**
 * Runs the command line.
 * @param argv arguments after the program name.
 * @returns the exit code.
 */
export async function main(argv: string[], io: Io = defaultIo): Promise<number> {
  if (argv[0] === 'spectrum') return spectrumCommand(argv.slice(1), io);
  if (argv[0] === 'sweep') return sweepCommand(argv.slice(1), io, { buildRegistry });
  let parsed: ReturnType<typeof parseArgs>;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      options: {
        out: { type: 'string', short: 'o' },
        plugin: { type: 'string', multiple: true },
        config: { type: 'string' },
        quiet: { type: 'boolean', short: 'q' },
        json: { type: 'boolean' },
        csv: { type: 'boolean' },
        report: { type: 'boolean' },
        threads: { type: 'string' },
        at: { type: 'string' },
        section: { type: 'boolean' },
        help: { type: 'boolean', short: 'h' },
      },
    });
  } catch (e) {
    io.err(`skein: ${(e as Error).message}\n\n${USAGE}`);
    return 2;
  }
  const flags = parsed.values as Flags;
  const [command, ...rest] = parsed.positionals;
  if (flags.help || command === undefined || command === 'help') {
    io.out(USAGE);
    return command === undefined && !flags.help ? 2 : 0;
  }
  try {
    switch (command) {
      case 'run': {
        const file = needFile(rest, 'run', 'a scenario file');
        await runFile(file, flags.out ?? defaultResultsPath(file), flags, io);
        return 0;
      }
      case 'demo': {
        const dir = flags.out ?? 'skein-demo';
        const { mkdirSync } = await import('node:fs');
        mkdirSync(dir, { recursive: true });
        await runFile(DEMO_SCENARIO, join(dir, 'demo.results.msgpack'), { ...flags, report: true }, io);
        return 0;
      }
      case 'plot': {
        const file = needFile(rest, 'plot', 'a results file');
        const plots = writePlots(file, flags.out ?? dirname(file), {});
        io.out(plots.map((p) => `${p.kind}: ${p.path}`).join('\n'));
        return 0;
      }
      case 'report': {
        const file = needFile(rest, 'report', 'a results file');
        const out = flags.out ?? file.replace(/\.msgpack$/, '') + '.report.html';
        io.out(`Report: ${writeReport(readResults(file), out, { resultsFile: basename(file) })}`);
        return 0;
      }
      case 'check': {
        const file = needFile(rest, 'check', 'a scenario file');
        const registry = await buildRegistry(flags);
        const sc = readScenario(file, registry);
        const plan = await compileScenario(sc, { registry });
        if (flags.json) {
          io.out(JSON.stringify({
            title: sc.title, digest: sc.digest, dtS: plan.dtS, steps: plan.nSteps, delays: plan.delays, warnings: plan.warnings,
            lines: sc.lines.map((l, i) => ({ id: l.id, conductors: l.conductors, velocitiesMps: Array.from(plan.modal[i].velocities), zcOhm: Array.from(plan.modal[i].Zc), modalImpedancesOhm: Array.from(plan.modal[i].Zm), ...fdCheckInfo(plan, i) })),
          }, null, 2));
        } else {
          io.out(formatCheck(plan));
        }
        return 0;
      }
      case 'inspect': {
        const file = needFile(rest, 'inspect', 'a results file');
        io.out(formatInspect(readResults(file), file));
        return 0;
      }
      case 'export': {
        const file = needFile(rest, 'export', 'a results file');
        if (!flags.csv) throw new InputError('E_USAGE', [], 'export needs a format flag: --csv', argv.join(' '));
        const csv = toCsv(readResults(file));
        if (flags.out) writeFileAtomic(flags.out, csv);
        else process.stdout.write(csv);
        return 0;
      }
      case 'params': {
        const file = needFile(rest, 'params', 'a scenario file');
        const registry = await buildRegistry(flags);
        const list = lineParams(readScenario(file, registry), parseFrequencies(flags.at));
        io.out(flags.json ? JSON.stringify(list, null, 2) : formatParams(list));
        return 0;
      }
      case 'schema':
        io.out(JSON.stringify(flags.section ? sectionSchema : scenarioSchema, null, 2));
        return 0;
      default:
        io.err(`skein: unknown command "${command}"\n\n${USAGE}`);
        return 2;
    }
  } catch (e) {
    return reportError(e, io);
  }
}

/** Pulls the engine's own options (--plugin, --config, --results, --quiet) out of a sub-command's arguments. */
function engineFlags(args: string[]): { rest: string[]; flags: Flags & { results?: string } } {
  const rest: string[] = [];
  const flags: Flags & { results?: string } = { plugin: [] };
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a === '--plugin' && i + 1 < args.length) flags.plugin!.push(args[++i]);
    else if (a === '--config' && i + 1 < args.length) flags.config = args[++i];
    else if (a === '--results' && i + 1 < args.length) flags.results = args[++i];
    else if (a === '--quiet' || a === '-q') flags.quiet = true;
    else rest.push(a);
  }
  return { rest, flags };
}

async function spectrumCommand(args: string[], io: Io): Promise<number> {
  try {
    const { rest, flags } = engineFlags(args);
    const cmd = parseSpectrumArgs(rest);
    const registry = await buildRegistry(flags);
    const sc = readScenario(cmd.scenarioFile, registry);
    const { section, table, touchstone, time } = await runSpectrumCommand(cmd, sc, registry);
    io.out(table);
    const out = flags.results ?? cmd.scenarioFile.replace(/\.(ya?ml|json)$/i, '') + '.spectrum.msgpack';
    writeFileAtomic(out, encodeResults(spectralResultsDocument(sc, time ? undefined : section, new Date(), time)));
    io.out(`Results: ${out}`);
    if (touchstone !== undefined && cmd.touchstoneFile) {
      writeFileAtomic(cmd.touchstoneFile, touchstone);
      io.out(`Touchstone: ${cmd.touchstoneFile}`);
    }
    return 0;
  } catch (e) {
    return reportError(e, io);
  }
}

function reportError(e: unknown, io: Io): number {
  if (e instanceof InputError) {
    io.err(`skein: ${e.message}`);
    return 2;
  }
  if (e instanceof SkeinError) {
    io.err(`skein: ${e.message} [${e.code}]`);
    return 1;
  }
  io.err(`skein: bug: ${(e as Error).stack ?? String(e)}`);
  return 1;
}

function needFile(rest: string[], command: string, what: string): string {
  if (rest.length !== 1) throw new InputError('E_USAGE', [], `skein ${command} takes ${what}`, rest.join(' ') || undefined);
  return rest[0];
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  // `pnpm skein ...` runs from the workspace root; paths on the command line are the user's.
  if (process.env.INIT_CWD) process.chdir(process.env.INIT_CWD);
  process.exitCode = await main(process.argv.slice(2));
}
