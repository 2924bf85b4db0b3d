/**
 * The plugin registry: which source, load and probe types a run may use. Plugin modules are
 * registered by module specifier (from the user's configuration or `--plugin` flags), never by a
 * scenario, so a scenario can only name types that are already registered.
 */
import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { duplicatePlugin, pluginLoadFailed, SkeinError } from '../errors.ts';
import type { AnyPlugin, LoadPlugin, ProbePlugin, SourcePlugin } from './api.ts';

const TYPE_NAME = /^[a-z][a-z0-9]*(-[a-z0-9]+)*$/;

interface Entry<T> {
  plugin: T;
  module: string;
}

/** A set of registered plugins, by kind and type name. */
export class PluginRegistry {
  readonly sources = new Map<string, Entry<SourcePlugin<any>>>();
  readonly loads = new Map<string, Entry<LoadPlugin<any>>>();
  readonly probes = new Map<string, Entry<ProbePlugin<any>>>();
  /** Module specifiers in the order they were loaded; workers load the same list in the same order. */
  readonly modules: string[] = [];

  /**
   * Adds one plugin.
   * @param plugin made by defineSource / defineLoad / defineProbe.
   * @param module the module it came from (named in duplicate errors).
   * @throws SkeinError E_PLUGIN_DUPLICATE when the type name is taken; E_PLUGIN_LOAD when the object is not a plugin.
   */
  register(plugin: AnyPlugin, module = '(registered in code)'): this {
    if (!isPlugin(plugin)) throw pluginLoadFailed(module, 'export is not a plugin made by defineSource, defineLoad or defineProbe');
    if (!TYPE_NAME.test(plugin.type)) {
      throw pluginLoadFailed(module, `type name "${plugin.type}" must be kebab-case (lower-case words joined by "-")`);
    }
    const map = this.mapOf(plugin.kind) as Map<string, Entry<AnyPlugin>>;
    const old = map.get(plugin.type);
    if (old) throw duplicatePlugin(plugin.kind, plugin.type, old.module, module);
    map.set(plugin.type, { plugin, module });
    return this;
  }

  /** The map of one kind. */
  mapOf(kind: AnyPlugin['kind']): Map<string, Entry<AnyPlugin>> {
    if (kind === 'source') return this.sources as Map<string, Entry<AnyPlugin>>;
    if (kind === 'load') return this.loads as Map<string, Entry<AnyPlugin>>;
    return this.probes as Map<string, Entry<AnyPlugin>>;
  }

  /** Sorted type names of one kind, for "expected one of" messages. */
  typesOf(kind: AnyPlugin['kind']): string[] {
    return [...this.mapOf(kind).keys()].sort();
  }
}

/** True when `x` looks like a plugin object. */
export function isPlugin(x: unknown): x is AnyPlugin {
  if (x === null || typeof x !== 'object') return false;
  const p = x as Record<string, unknown>;
  return (p.kind === 'source' || p.kind === 'load' || p.kind === 'probe') && typeof p.type === 'string' &&
    typeof p.create === 'function' && typeof p.params === 'object' && p.params !== null;
}

/**
 * Resolves a module specifier to a URL that any thread can import: bare names are resolved from
 * `parentUrl` (default: the current directory), relative and absolute paths become file URLs.
 */
export function resolvePluginSpecifier(specifier: string, parentUrl = pathToFileURL(`${process.cwd()}/`).href): string {
  if (/^[a-z]+:/.test(specifier)) return specifier;
  if (specifier.startsWith('.') || specifier.startsWith('/')) return new URL(specifier, parentUrl).href;
  // Node 20's import.meta.resolve ignores a parent URL, so bare names go through the CommonJS
  // resolver of the parent, which honours package "exports" the same way for these packages.
  try {
    return pathToFileURL(createRequire(parentUrl).resolve(specifier)).href;
  } catch (e) {
    throw pluginLoadFailed(specifier, `cannot be resolved from ${parentUrl}`, e);
  }
}

/**
 * Imports plugin modules and registers their default exports (one plugin or an array of them).
 * @param registry where to register.
 * @param specifiers module specifiers or URLs, in order.
 * @throws SkeinError E_PLUGIN_LOAD, E_PLUGIN_DUPLICATE.
 */
export async function loadPluginModules(registry: PluginRegistry, specifiers: readonly string[], parentUrl?: string): Promise<PluginRegistry> {
  for (const spec of specifiers) {
    const url = resolvePluginSpecifier(spec, parentUrl);
    let mod: { default?: unknown };
    try {
      mod = (await import(url)) as { default?: unknown };
    } catch (e) {
      if (e instanceof SkeinError) throw e;
      throw pluginLoadFailed(spec, `import failed: ${(e as Error).message}`, e);
    }
    const exported = mod.default;
    const list = Array.isArray(exported) ? exported : [exported];
    if (list.length === 0 || exported === undefined) throw pluginLoadFailed(spec, 'has no default export (a plugin or an array of plugins)');
    for (const p of list) registry.register(p as AnyPlugin, spec);
    registry.modules.push(url);
  }
  return registry;
}
