/**
 * Checks a plugin's parameters against its schema and converts quantities to SI.
 */
import type { DocPath } from '../errors.ts';
import type { LocatedDocument } from '../scenario/document.ts';
import { formatQuantity, parseQuantity, quantityName, unitExample } from '../units.ts';
import type { ParamSchema, ParamSpec } from './api.ts';

/**
 * Resolves the parameters of one plugin use.
 * @param schema the plugin's schema.
 * @param raw the object from the scenario holding the parameters (and other keys listed in `reserved`).
 * @param path where `raw` sits in the document.
 * @param doc the document, for located errors.
 * @param reserved keys of `raw` that belong to the engine, not to the plugin.
 * @param owner "load resistor" etc., for messages.
 * @throws InputError naming the parameter, the rule and the value.
 */
export function resolveParams(
  schema: ParamSchema,
  raw: Record<string, unknown>,
  path: DocPath,
  doc: LocatedDocument,
  reserved: readonly string[],
  owner: string,
): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(raw)) {
    if (reserved.includes(key)) continue;
    if (!(key in schema)) {
      const accepted = [...reserved, ...Object.keys(schema)].join(', ');
      throw doc.fail([...path, key], `is not a parameter of ${owner}; accepted: ${accepted}`, raw[key], 'E_UNKNOWN_KEY');
    }
  }
  for (const [name, spec] of Object.entries(schema)) {
    const p = [...path, name];
    const value = raw[name];
    if (value === undefined) {
      if (spec.kind !== 'table' && spec.default !== undefined) out[name] = spec.default;
      else if (!isOptional(spec)) throw doc.fail(p, `is required by ${owner} (${spec.summary})`, undefined, 'E_MISSING');
      continue;
    }
    out[name] = resolveOne(spec, value, p, doc);
  }
  return out;
}

function isOptional(spec: ParamSpec): boolean {
  return spec.optional === true;
}

function resolveOne(spec: ParamSpec, value: unknown, p: DocPath, doc: LocatedDocument): unknown {
  switch (spec.kind) {
    case 'enum':
      if (typeof value !== 'string' || !spec.values.includes(value)) {
        throw doc.fail(p, `must be one of ${spec.values.join(', ')}`, value, 'E_ENUM');
      }
      return value;
    case 'boolean':
      if (typeof value !== 'boolean') throw doc.fail(p, 'must be true or false', value, 'E_TYPE');
      return value;
    case 'string':
      if (typeof value !== 'string' || value === '') throw doc.fail(p, 'must be a non-empty string', value, 'E_TYPE');
      return value;
    case 'integer': {
      if (typeof value !== 'number' || !Number.isInteger(value)) throw doc.fail(p, 'must be an integer', value, 'E_TYPE');
      if (spec.min !== undefined && value < spec.min) throw doc.fail(p, `must be at least ${spec.min}`, value, 'E_RANGE');
      if (spec.max !== undefined && value > spec.max) throw doc.fail(p, `must be at most ${spec.max}`, value, 'E_RANGE');
      return value;
    }
    case 'table': {
      if (!Array.isArray(value) || value.length < 2) {
        throw doc.fail(p, `must be a list of at least two [${spec.columns.join(', ')}] pairs`, value, 'E_TABLE');
      }
      const rows: Array<[number, number]> = [];
      value.forEach((row, i) => {
        if (!Array.isArray(row) || row.length !== 2) throw doc.fail([...p, i], `must be a pair [${spec.columns.join(', ')}]`, row, 'E_TABLE');
        const a = parseQuantity(row[0], spec.columns[0]);
        const b = parseQuantity(row[1], spec.columns[1]);
        if (a === undefined) throw doc.fail([...p, i, 0], `must be a ${quantityName(spec.columns[0])} such as ${unitExample(spec.columns[0])}`, row[0], 'E_QUANTITY');
        if (b === undefined) throw doc.fail([...p, i, 1], `must be a ${quantityName(spec.columns[1])} such as ${unitExample(spec.columns[1])}`, row[1], 'E_QUANTITY');
        if (spec.increasingFirst !== false && i > 0 && !(a > rows[i - 1][0])) {
          throw doc.fail([...p, i, 0], `must be greater than the previous row's ${formatQuantity(rows[i - 1][0], spec.columns[0])}`, row[0], 'E_TABLE');
        }
        rows.push([a, b]);
      });
      return rows;
    }
    default: {
      const x = parseQuantity(value, spec.unit);
      if (x === undefined) {
        throw doc.fail(p, `must be a ${quantityName(spec.unit)} such as ${unitExample(spec.unit)}`, value, 'E_QUANTITY');
      }
      if (spec.min !== undefined && (spec.exclusiveMin ? !(x > spec.min) : !(x >= spec.min))) {
        const word = spec.exclusiveMin ? 'greater than' : 'at least';
        throw doc.fail(p, `must be ${word} ${formatQuantity(spec.min, spec.unit === '1' ? '' : spec.unit)}`, value, 'E_RANGE');
      }
      if (spec.max !== undefined && x > spec.max) {
        throw doc.fail(p, `must be at most ${formatQuantity(spec.max, spec.unit === '1' ? '' : spec.unit)}`, value, 'E_RANGE');
      }
      return x;
    }
  }
}
