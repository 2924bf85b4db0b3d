/**
 * The resolved scenario as bytes for the workers of a partitioned run: packed once as
 * MessagePack (msgpackr, typed arrays kept as typed arrays) into a SharedArrayBuffer that every
 * worker reads. A structured clone per worker is made on the sending thread, one after the
 * other, and is slow for graphs of many small objects: 16 s per worker for 10^5 four-conductor
 * junctions, against 5-7 s to pack once and about 3 s to unpack in each worker in parallel.
 * Records (msgpackr's `useRecords`: the keys of a repeated object shape written once) make the
 * bytes 81 MB instead of 129 MB there and unpacking 3 s instead of 14 s.
 */
import { Packr } from 'msgpackr';
import type { ResolvedScenario } from '../model.ts';

/** A resolved scenario without its `locate` (a closure over the parsed document). */
type PortableScenario = Omit<ResolvedScenario, 'locate'> & { locate?: undefined };

const packr = new Packr({ moreTypes: true, useRecords: true });

/**
 * Whether the scenario can travel as data: lines given by a section carry closures (R(f), L(f),
 * G(f), C(f)), and a plugin's parameter default might be a function or another value that
 * MessagePack does not carry as it is (a symbol, -0); the workers of such a scenario resolve it
 * again from its source.
 */
export function isPortable(scenario: ResolvedScenario): boolean {
  if (scenario.lines.some((l) => l.section !== undefined)) return false;
  for (const j of scenario.junctions) for (const p of j.parts) if (!isPlainData(p.params)) return false;
  return scenario.probes.every((p) => isPlainData(p.params));
}

/** True when `x` holds only what MessagePack carries unchanged: no functions, symbols or -0. */
function isPlainData(x: unknown): boolean {
  if (typeof x === 'function' || typeof x === 'symbol') return false;
  if (typeof x === 'number') return !Object.is(x, -0);
  if (x === null || typeof x !== 'object' || ArrayBuffer.isView(x)) return true;
  if (Array.isArray(x)) return x.every(isPlainData);
  return Object.values(x).every(isPlainData);
}

/** Packs the scenario (without `locate`) into shared memory. */
export function packScenario(scenario: ResolvedScenario): SharedArrayBuffer {
  const bytes = packr.pack({ ...scenario, locate: undefined });
  const shared = new SharedArrayBuffer(bytes.length);
  new Uint8Array(shared).set(bytes);
  return shared;
}

/**
 * Unpacks a scenario packed by packScenario. The bytes are copied first, so that nothing the
 * caller unpacks shares memory with another thread.
 * @param file the scenario's file name for `locate` (the workers report no document positions).
 */
export function unpackScenario(shared: SharedArrayBuffer, file: string | undefined): ResolvedScenario {
  const own = Buffer.alloc(shared.byteLength);
  own.set(new Uint8Array(shared));
  const data = packr.unpack(own) as PortableScenario;
  return { ...data, locate: () => ({ file }) };
}
