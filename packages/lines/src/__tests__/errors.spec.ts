import { describe, it, expect } from 'vitest';
import { computeSection, SectionError, formatPath } from '../index.ts';

function catchError(input: unknown): SectionError {
  try {
    computeSection(input);
  } catch (e) {
    expect(e).toBeInstanceOf(SectionError);
    expect(e).toBeInstanceOf(Error);
    return e as SectionError;
  }
  throw new Error('expected a SectionError');
}

const wire = (name: string, x: number, y: number, radius: number, extra: Record<string, unknown> = {}): Record<string, unknown> => ({ name, x, y, radius, ...extra });

describe('SectionError', () => {
  it('names the path, the rule and the value for a non-positive radius', () => {
    const e = catchError({ kind: 'wires', ground: 'perfect', wires: [wire('a', 0, 1, 0.01), wire('b', 0.5, 1, -0.002)] });
    expect(e.code).toBe('SECTION_NOT_POSITIVE');
    expect(e.path).toEqual(['wires', 1, 'radius']);
    expect(e.rule).toBe('must be a positive length');
    expect(e.value).toBe(-0.002);
    expect(e.message).toBe('wires[1].radius: must be a positive length, got -0.002 m');
    expect(catchError({ kind: 'wires', ground: 'perfect', wires: [wire('a', 0, 1, 0)] }).code).toBe('SECTION_NOT_POSITIVE');
  });

  it('reports overlapping conductors at the later wire, naming the other', () => {
    const e = catchError({ kind: 'wires', ground: 'perfect', wires: [wire('a', 0, 1, 0.01), wire('b', 0.015, 1, 0.01)] });
    expect(e.code).toBe('SECTION_OVERLAP');
    expect(e.path).toEqual(['wires', 1]);
    expect(e.value).toBeCloseTo(0.015, 15);
    expect(e.message).toContain("wires[0] ('a')");
  });

  it('reports overlapping insulation even when the metal is apart', () => {
    const ins = { thickness: 1e-3, relPermittivity: 3 };
    const e = catchError({ kind: 'wires', ground: 'perfect', wires: [wire('a', 0, 0.01, 1e-3, { insulation: ins }), wire('b', 3.5e-3, 0.01, 1e-3, { insulation: ins })] });
    expect(e.code).toBe('SECTION_OVERLAP');
    expect(e.path).toEqual(['wires', 1]);
  });

  it('reports a wire below or touching the ground plane', () => {
    const e = catchError({ kind: 'wires', ground: { resistivityOhmM: 100 }, wires: [wire('a', 0, -1, 0.01)] });
    expect(e.code).toBe('SECTION_BELOW_GROUND');
    expect(e.path).toEqual(['wires', 0, 'y']);
    expect(e.value).toBe(-1);
    expect(catchError({ kind: 'wires', ground: 'perfect', wires: [wire('a', 0, 0.01, 0.01)] }).code).toBe('SECTION_BELOW_GROUND');
    // insulation reaching into the ground
    const i = catchError({ kind: 'wires', ground: 'perfect', wires: [wire('a', 0, 0.0015, 1e-3, { insulation: { thickness: 1e-3, relPermittivity: 3 } })] });
    expect(i.code).toBe('SECTION_BELOW_GROUND');
  });

  it('reports insulation thinner than zero at its thickness', () => {
    const e = catchError({ kind: 'wires', ground: 'perfect', wires: [wire('a', 0, 1, 0.001, { insulation: { thickness: -1e-4, relPermittivity: 3 } })] });
    expect(e.code).toBe('SECTION_NEGATIVE');
    expect(e.path).toEqual(['wires', 0, 'insulation', 'thickness']);
    expect(e.message).toBe('wires[0].insulation.thickness: must be a non-negative length, got -0.0001 m');
  });

  it('lists the accepted kinds and grounds', () => {
    const e = catchError({ kind: 'twisted' });
    expect(e.code).toBe('SECTION_ENUM');
    expect(e.path).toEqual(['kind']);
    expect(e.message).toContain("'wires', 'coax', 'microstrip', 'stripline', 'coupled-stripline'");
    const g = catchError({ kind: 'wires', ground: 'wet', wires: [wire('a', 0, 1, 0.01)] });
    expect(g.code).toBe('SECTION_ENUM');
    expect(g.path).toEqual(['ground']);
  });

  it('rejects unknown fields, duplicate names, missing fields and non-finite numbers', () => {
    expect(catchError({ kind: 'wires', ground: 'perfect', wires: [{ name: 'a', x: 0, y: 1, radus: 0.01 }] }).path).toEqual(['wires', 0, 'radus']);
    const d = catchError({ kind: 'wires', ground: 'perfect', wires: [wire('a', 0, 1, 0.01), wire('a', 1, 1, 0.01)] });
    expect(d.code).toBe('SECTION_DUPLICATE_NAME');
    expect(d.path).toEqual(['wires', 1, 'name']);
    const m = catchError({ kind: 'wires', ground: 'perfect', wires: [{ name: 'a', x: 0, radius: 0.01 }] });
    expect(m.code).toBe('SECTION_REQUIRED');
    expect(m.path).toEqual(['wires', 0, 'y']);
    const n = catchError({ kind: 'wires', ground: 'perfect', wires: [wire('a', 0, Number.NaN, 0.01)] });
    expect(n.code).toBe('SECTION_NOT_FINITE');
    const t = catchError('coax');
    expect(t.code).toBe('SECTION_TYPE');
    expect(t.path).toEqual([]);
    expect(t.message.startsWith('section: must be an object')).toBe(true);
  });

  it('requires a reference wire in free space', () => {
    const e = catchError({ kind: 'wires', ground: 'none', wires: [wire('a', 0, 0, 0.001), wire('b', 0.01, 0, 0.001)] });
    expect(e.code).toBe('SECTION_REFERENCE');
    expect(e.path).toEqual(['reference']);
    expect(catchError({ kind: 'wires', ground: 'perfect', reference: 'a', wires: [wire('a', 0, 1, 0.001)] }).code).toBe('SECTION_REFERENCE');
  });

  it('rejects a coax shield inside its inner conductor and a shield below ground', () => {
    const e = catchError({ kind: 'coax', innerRadius: 2e-3, shieldInnerRadius: 1e-3, dielectric: { relPermittivity: 2 } });
    expect(e.code).toBe('SECTION_ORDER');
    expect(e.path).toEqual(['shieldInnerRadius']);
    const g = catchError({ kind: 'coax', innerRadius: 1e-3, shieldInnerRadius: 3e-3, dielectric: { relPermittivity: 2 }, overGround: { height: 2e-3, ground: 'perfect' } });
    expect(g.code).toBe('SECTION_BELOW_GROUND');
    expect(g.path).toEqual(['overGround', 'height']);
  });

  it('rejects thin-wire formulas for insulated wires and printed lines without a thickness for loss', () => {
    const e = catchError({ kind: 'wires', ground: 'perfect', solver: 'thin-wire', wires: [wire('a', 0, 1, 0.001, { insulation: { thickness: 1e-4, relPermittivity: 3 } })] });
    expect(e.code).toBe('SECTION_UNSUPPORTED');
    expect(e.path).toEqual(['solver']);
    const m = catchError({ kind: 'microstrip', width: 1e-3, substrateHeight: 1e-3, substrate: { relPermittivity: 4 } });
    expect(m.code).toBe('SECTION_REQUIRED');
    expect(m.path).toEqual(['thickness']);
    const p = catchError({ kind: 'stripline', width: 1e-3, plateSpacing: 1e-3, material: 'perfect', dielectric: { relPermittivity: 0.5 } });
    expect(p.code).toBe('SECTION_RANGE');
    expect(p.path).toEqual(['dielectric', 'relPermittivity']);
  });

  it('rejects a negative or non-finite frequency', () => {
    const s = computeSection({ kind: 'coax', innerRadius: 1e-3, shieldInnerRadius: 3e-3, dielectric: { relPermittivity: 2 } });
    expect(() => s.rlgcAt(-1)).toThrow(SectionError);
    expect(() => s.zyAt(Number.NaN)).toThrow(/frequency/);
  });
});

describe('formatPath', () => {
  it('prints indices in brackets and keys with dots', () => {
    expect(formatPath(['wires', 2, 'insulation', 'thickness'])).toBe('wires[2].insulation.thickness');
    expect(formatPath([])).toBe('section');
  });
});
