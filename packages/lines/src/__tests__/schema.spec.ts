import { describe, it, expect } from 'vitest';
import * as ajvModule from 'ajv/dist/2020.js';
import { sectionSchema, computeSection } from '../index.ts';
import { hollowCreekFeeder } from '../../examples/overheadLine.ts';

// ajv (a general JSON Schema library) checks that the schema is valid draft 2020-12 and that it
// agrees with computeSection on inputs both accept and on shapes both reject.
type AjvCtor = new (opts: { strict: boolean; allErrors: boolean }) => { compile: (s: object) => ((d: unknown) => boolean) & { errors?: unknown } };
const mod = ajvModule as unknown as { default: AjvCtor | { default: AjvCtor } };
const Ajv2020: AjvCtor = typeof mod.default === 'function' ? mod.default : mod.default.default;
const ajv = new Ajv2020({ strict: false, allErrors: true });
const validate = ajv.compile(sectionSchema);

const good: unknown[] = [
  hollowCreekFeeder,
  { kind: 'wires', ground: 'none', reference: 'r', wires: [{ name: 's', x: 0, y: 0, radius: 1e-3 }, { name: 'r', x: 5e-3, y: 0, radius: 1e-3, insulation: { thickness: 1e-3, relPermittivity: 3 } }] },
  { kind: 'coax', innerRadius: 0.4e-3, shieldInnerRadius: 1.5e-3, dielectric: { relPermittivity: 2.25, lossTangent: 1e-4, model: 'djordjevic-sarkar' }, shield: { thickness: 1e-4 }, overGround: { height: 0.1, ground: { resistivityOhmM: 50, relPermittivity: 10 }, jacket: { thickness: 1e-3, relPermittivity: 2.5 } } },
  { kind: 'microstrip', width: 1e-3, substrateHeight: 0.8e-3, thickness: 35e-6, substrate: { relPermittivity: 4.4, lossTangent: 0.02 } },
  { kind: 'stripline', width: 1e-3, plateSpacing: 1e-3, material: 'perfect', dielectric: { relPermittivity: 1 } },
  { kind: 'coupled-stripline', width: 1e-3, gap: 0.5e-3, plateSpacing: 1e-3, thickness: 17e-6, material: { conductivity: 4e7 }, dielectric: { relPermittivity: 3 } },
];

const bad: unknown[] = [
  { kind: 'wires', ground: 'perfect', wires: [{ name: 'a', x: 0, y: 1, radius: -1 }] },
  { kind: 'wires', ground: 'perfect', wires: [{ name: 'a', x: 0, y: 1, radius: 1, colour: 'red' }] },
  { kind: 'coax', innerRadius: 1e-3, shieldInnerRadius: 2e-3 },
  { kind: 'spiral' },
  { kind: 'microstrip', width: 1e-3, substrateHeight: 1e-3, thickness: 1e-5, substrate: { relPermittivity: 0.5 } },
];

describe('sectionSchema', () => {
  it('is a draft 2020-12 schema that accepts the inputs computeSection accepts', () => {
    expect(sectionSchema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    for (const g of good) {
      expect(() => computeSection(g)).not.toThrow();
      expect(validate(g), JSON.stringify(validate.errors)).toBe(true);
    }
  });

  it('rejects the shapes computeSection rejects', () => {
    for (const b of bad) {
      expect(() => computeSection(b)).toThrow();
      expect(validate(b)).toBe(false);
    }
  });
});
