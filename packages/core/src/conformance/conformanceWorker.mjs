// Worker bootstrap of the plugin conformance suite. Plain .mjs so that Node runs it without a
// loader: it registers tsx (plugins and core are TypeScript sources), resolves and imports the
// plugin module by its specifier, then runs the checks (workerChecks.ts) and posts the report.
import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { parentPort, workerData } from 'node:worker_threads';
import { register } from 'tsx/esm/api';

register();

function resolveSpecifier(specifier, parentUrl) {
  if (/^[a-z][a-z0-9+.-]*:/i.test(specifier)) return specifier;
  if (specifier.startsWith('.') || specifier.startsWith('/')) return new URL(specifier, parentUrl).href;
  try {
    return import.meta.resolve(specifier, parentUrl);
  } catch (first) {
    try {
      return pathToFileURL(createRequire(parentUrl).resolve(specifier)).href;
    } catch {
      throw first;
    }
  }
}

const { specifier, parentUrl } = workerData;
const { runWorkerChecks } = await import('./workerChecks.ts');
let url;
let mod;
let loadError;
try {
  url = resolveSpecifier(specifier, parentUrl);
  mod = await import(url);
} catch (e) {
  loadError = e instanceof Error ? `${e.name}: ${e.message}` : String(e);
}
const report = await runWorkerChecks(workerData, { url, mod, loadError });
parentPort.postMessage(report);
