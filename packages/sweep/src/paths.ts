/**
 * Addressing values inside a scenario document by a dotted path: `lines.feeder.length`,
 * `junctions.B.parts.R1.resistance`, `lines.trunk.inductance[0][1]`. Ids in a scenario are
 * letters, digits, "_" and "-", so a dot always separates two keys.
 */
import type { DocPath } from '@skein/core';

const SEGMENT = /^([A-Za-z_][A-Za-z0-9_-]*)((?:\[\d+\])*)$/;

/**
 * Splits a dotted path into keys and list indices.
 * @param text e.g. "lines.trunk.inductance[0][1]".
 * @returns the path, e.g. ["lines", "trunk", "inductance", 0, 1], or undefined when malformed.
 * @example parseValuePath('lines.feeder.length') // ['lines', 'feeder', 'length']
 */
export function parseValuePath(text: string): Array<string | number> | undefined {
  if (typeof text !== 'string' || text === '') return undefined;
  const out: Array<string | number> = [];
  for (const seg of text.split('.')) {
    const m = SEGMENT.exec(seg);
    if (!m) return undefined;
    out.push(m[1]);
    for (const idx of m[2].matchAll(/\[(\d+)\]/g)) out.push(Number(idx[1]));
  }
  return out;
}

type Container = Record<string, unknown> | unknown[];

function isContainer(x: unknown): x is Container {
  return x !== null && typeof x === 'object';
}

/**
 * Checks that `path` can be set in `data`: every parent exists, and the last key exists or its
 * parent is a mapping (so an optional parameter left at its default can be swept too).
 * @returns undefined when settable, otherwise the reason (naming the first missing part).
 */
export function checkSettable(data: unknown, path: DocPath): string | undefined {
  let node: unknown = data;
  for (let k = 0; k < path.length; k++) {
    const key = path[k];
    const last = k === path.length - 1;
    const where = k === 0 ? 'the scenario' : path.slice(0, k).join('.');
    if (Array.isArray(node)) {
      if (typeof key !== 'number') return `${where} is a list: address an element with [index]`;
      if (key >= node.length) return `${where} has ${node.length} elements, so [${key}] does not exist`;
    } else if (isContainer(node)) {
      if (typeof key === 'number') return `${where} is a mapping, not a list`;
      if (!(key in node)) {
        if (last) return undefined;
        const keys = Object.keys(node);
        return `${where} has no key "${key}"${keys.length > 0 ? `; keys there: ${keys.join(', ')}` : ''}`;
      }
    } else {
      return `${where} is a single value, not a mapping or list`;
    }
    node = (node as Record<string | number, unknown>)[key as never];
  }
  return undefined;
}

/**
 * Sets the value at `path` in place (the caller clones first).
 * @throws Error when a parent is missing (call checkSettable first).
 */
export function setAt(data: unknown, path: DocPath, value: unknown): void {
  let node = data as Record<string | number, unknown>;
  for (let k = 0; k < path.length - 1; k++) {
    const next = node[path[k] as never];
    if (!isContainer(next)) throw new Error(`bug: path ${path.join('.')} has no parent at ${path[k]}`);
    node = next as Record<string | number, unknown>;
  }
  node[path[path.length - 1] as never] = value;
}

/** Reads the value at `path`, or undefined when any part is missing. */
export function getAt(data: unknown, path: DocPath): unknown {
  let node: unknown = data;
  for (const key of path) {
    if (!isContainer(node)) return undefined;
    node = (node as Record<string | number, unknown>)[key as never];
  }
  return node;
}
