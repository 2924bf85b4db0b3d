/**
 * JSON Schema (draft 2020-12) of the section input, as a plain object the CLI can print.
 * It describes shapes and simple ranges; geometry rules (overlap, above ground) are checked by
 * computeSection, which reports them as located SectionErrors.
 */

const length = (description: string, min: 'positive' | 'nonNegative' | 'any' = 'positive'): Record<string, unknown> => {
  const s: Record<string, unknown> = { type: 'number', description: `${description} [m]` };
  if (min === 'positive') s.exclusiveMinimum = 0;
  if (min === 'nonNegative') s.minimum = 0;
  return s;
};

const dielectricProps = {
  relPermittivity: { type: 'number', minimum: 1, description: 'Relative permittivity [-] (at specAtHz for the wideband model)' },
  lossTangent: { type: 'number', minimum: 0, maximum: 1, default: 0, description: 'Loss tangent [-]' },
  model: { enum: ['constant', 'djordjevic-sarkar'], default: 'constant', description: 'Dielectric model' },
  specAtHz: { type: 'number', exclusiveMinimum: 0, default: 1e9, description: 'Frequency of the specification [Hz] (wideband model)' },
  lowHz: { type: 'number', exclusiveMinimum: 0, default: 1e3, description: 'Lower corner [Hz] (wideband model)' },
  highHz: { type: 'number', exclusiveMinimum: 0, default: 1e12, description: 'Upper corner [Hz] (wideband model)' },
};

/** Schema of a JSON Schema document (loose, for typing only). */
export type JsonSchema = Record<string, unknown>;

/**
 * The JSON Schema (draft 2020-12) of a cross-section input.
 *
 * @example sectionSchema.$schema // 'https://json-schema.org/draft/2020-12/schema'
 */
export const sectionSchema: JsonSchema = {
  $schema: 'https://json-schema.org/draft/2020-12/schema',
  $id: 'https://skein.invalid/schemas/lines/section.json',
  title: 'skein line cross-section',
  description: 'A transmission-line cross-section; numbers in SI units (m, S/m, ohm*m, Hz).',
  type: 'object',
  required: ['kind'],
  oneOf: [{ $ref: '#/$defs/wires' }, { $ref: '#/$defs/coax' }, { $ref: '#/$defs/microstrip' }, { $ref: '#/$defs/stripline' }, { $ref: '#/$defs/coupledStripline' }],
  $defs: {
    material: {
      description: "Conductor material (default 'copper', 5.8e7 S/m); 'perfect' means lossless",
      oneOf: [
        { enum: ['copper', 'aluminium', 'perfect'] },
        {
          type: 'object',
          additionalProperties: false,
          required: ['conductivity'],
          properties: { conductivity: { type: 'number', exclusiveMinimum: 0, description: 'Conductivity [S/m]' }, relPermeability: { type: 'number', minimum: 1, default: 1 } },
        },
      ],
    },
    dielectric: { type: 'object', additionalProperties: false, required: ['relPermittivity'], properties: dielectricProps },
    insulation: {
      type: 'object',
      additionalProperties: false,
      required: ['thickness', 'relPermittivity'],
      properties: { thickness: length('Radial thickness', 'nonNegative'), ...dielectricProps },
    },
    earth: {
      type: 'object',
      additionalProperties: false,
      required: ['resistivityOhmM'],
      properties: {
        resistivityOhmM: { type: 'number', exclusiveMinimum: 0, description: 'Earth resistivity [ohm*m]' },
        relPermittivity: { type: 'number', minimum: 1, description: 'Earth relative permittivity [-] (omitted: Carson, no displacement current)' },
        model: { enum: ['carson', 'complex-depth'], default: 'carson', description: 'Earth-return model: Carson integral (numerical) or Deri complex depth' },
      },
    },
    wire: {
      type: 'object',
      additionalProperties: false,
      required: ['name', 'x', 'y', 'radius'],
      properties: {
        name: { type: 'string', minLength: 1 },
        x: length('Horizontal position', 'any'),
        y: length('Height of the axis above ground (any vertical position when ground is none)', 'any'),
        radius: length('Conductor radius (each sub-conductor for bundles)'),
        material: { $ref: '#/$defs/material' },
        insulation: { $ref: '#/$defs/insulation' },
        bundle: {
          type: 'object',
          additionalProperties: false,
          required: ['count', 'spacing'],
          properties: { count: { type: 'integer', minimum: 2, maximum: 16 }, spacing: length('Distance between adjacent sub-conductors') },
        },
      },
    },
    wires: {
      type: 'object',
      additionalProperties: false,
      required: ['kind', 'ground', 'wires'],
      properties: {
        kind: { const: 'wires' },
        ground: { oneOf: [{ enum: ['none', 'perfect'] }, { $ref: '#/$defs/earth' }] },
        reference: { type: 'string', description: "Name of the reference wire (ground 'none' only)" },
        wires: { type: 'array', minItems: 1, items: { $ref: '#/$defs/wire' } },
        solver: { enum: ['auto', 'thin-wire', 'numeric'], default: 'auto' },
        harmonics: { type: 'integer', minimum: 1, maximum: 64, description: 'Harmonics per circle for the numerical solver (omitted: automatic)' },
      },
    },
    coax: {
      type: 'object',
      additionalProperties: false,
      required: ['kind', 'innerRadius', 'shieldInnerRadius', 'dielectric'],
      properties: {
        kind: { const: 'coax' },
        innerRadius: length('Inner conductor radius'),
        shieldInnerRadius: length('Inner radius of the shield'),
        dielectric: { $ref: '#/$defs/dielectric' },
        innerMaterial: { $ref: '#/$defs/material' },
        shield: {
          type: 'object',
          additionalProperties: false,
          properties: { thickness: length('Shield thickness (omitted: perfect shield)'), material: { $ref: '#/$defs/material' } },
        },
        overGround: {
          type: 'object',
          additionalProperties: false,
          required: ['height', 'ground'],
          properties: {
            height: length('Height of the cable axis above ground'),
            ground: { oneOf: [{ const: 'perfect' }, { $ref: '#/$defs/earth' }] },
            jacket: { $ref: '#/$defs/insulation' },
          },
        },
      },
    },
    microstrip: {
      type: 'object',
      additionalProperties: false,
      required: ['kind', 'width', 'substrateHeight', 'substrate'],
      properties: {
        kind: { const: 'microstrip' },
        width: length('Strip width'),
        substrateHeight: length('Substrate height'),
        thickness: length("Strip thickness (required unless material is 'perfect')"),
        substrate: { $ref: '#/$defs/dielectric' },
        material: { $ref: '#/$defs/material' },
      },
    },
    stripline: {
      type: 'object',
      additionalProperties: false,
      required: ['kind', 'width', 'plateSpacing', 'dielectric'],
      properties: {
        kind: { const: 'stripline' },
        width: length('Strip width'),
        plateSpacing: length('Ground-plane spacing b'),
        thickness: length("Strip thickness, for conductor loss (required unless material is 'perfect')"),
        dielectric: { $ref: '#/$defs/dielectric' },
        material: { $ref: '#/$defs/material' },
      },
    },
    coupledStripline: {
      type: 'object',
      additionalProperties: false,
      required: ['kind', 'width', 'gap', 'plateSpacing', 'dielectric'],
      properties: {
        kind: { const: 'coupled-stripline' },
        width: length('Width of each strip'),
        gap: length('Edge-to-edge gap'),
        plateSpacing: length('Ground-plane spacing b'),
        thickness: length("Strip thickness, for conductor loss (required unless material is 'perfect')"),
        dielectric: { $ref: '#/$defs/dielectric' },
        material: { $ref: '#/$defs/material' },
      },
    },
  },
};
