/**
 * Lines given by cross-section geometry: the adapter between a scenario's `section` and the
 * line-geometry package. Quantities in the section may carry units ("2cm", "100ohm*m"); they are
 * turned into SI numbers first, and the geometry package's errors are located in the file.
 */
import { computeSection, SectionError, type LineSection } from '@skein/lines';
import type { DocPath } from '../errors.ts';
import { parseAnyQuantity } from '../units.ts';
import type { LocatedDocument } from './document.ts';
import type { SectionMatrices } from './resolve.ts';

// Keys whose values are names or choices, never quantities.
const TEXT_KEYS = new Set(['kind', 'name', 'model', 'material', 'ground', 'dielectricModel', 'type']);

function toSi(v: unknown, key: string | number | undefined): unknown {
  if (Array.isArray(v)) return v.map((x, i) => toSi(x, i));
  if (v !== null && typeof v === 'object') {
    const o: Record<string, unknown> = {};
    for (const [k, x] of Object.entries(v)) o[k] = toSi(x, k);
    return o;
  }
  if (typeof v === 'string' && !(typeof key === 'string' && TEXT_KEYS.has(key))) {
    const x = parseAnyQuantity(v);
    if (x !== undefined) return x;
  }
  return v;
}

/**
 * Computes a line's matrices from its `section`.
 * @throws InputError located at the offending value inside the section.
 */
export function resolveSection(section: unknown, path: DocPath, doc: LocatedDocument): SectionMatrices & { model: LineSection } {
  let s: LineSection;
  try {
    s = computeSection(toSi(section, undefined));
  } catch (e) {
    if (e instanceof SectionError) throw doc.fail([...path, ...e.path], e.rule, e.value, `E_${e.code}`);
    throw e;
  }
  return { conductors: s.conductors, L: s.L, C: s.C, origin: `section: ${s.describe}`, model: s };
}
