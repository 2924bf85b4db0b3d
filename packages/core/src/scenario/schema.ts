/**
 * JSON Schema (draft 2020-12) of the scenario format, for editors and for `skein schema`. The
 * engine's own validation (resolve.ts) is stricter: it also checks units, matrix properties,
 * wiring and each plugin's parameters, and it locates every error in the file.
 */
const quantity = (unit: string, example: string) => ({
  description: `a ${unit} quantity: a number in SI units or text with an SI prefix, e.g. "${example}"`,
  oneOf: [{ type: 'number' }, { type: 'string', pattern: '^\\s*[+-]?(\\d+\\.?\\d*|\\.\\d+)([eE][+-]?\\d+)?\\s*\\S*\\s*$' }],
});
const matrix = (unit: string, example: string) => ({
  description: `n x n matrix per metre (list of rows), or one value for one conductor; ${unit}`,
  oneOf: [quantity(unit, example), { type: 'array', items: { type: 'array', items: quantity(unit, example) } }],
});
const id = { type: 'string', pattern: '^[A-Za-z_][A-Za-z0-9_-]*$' };

/** The scenario JSON Schema as a plain object. */
export const scenarioSchema = {
  $schema: 'https://json-schema.org/draft/2020-12/schema',
  $id: 'skein-scenario-1',
  title: 'skein scenario, format 1',
  type: 'object',
  required: ['skein', 'time', 'lines', 'junctions'],
  additionalProperties: false,
  properties: {
    skein: { const: 1, description: 'scenario format version' },
    title: { type: 'string' },
    time: {
      type: 'object',
      required: ['end'],
      additionalProperties: false,
      properties: {
        end: quantity('time', '2us'),
        step: { description: '"auto" (default) or a time step', oneOf: [{ const: 'auto' }, quantity('time', '0.1ns')] },
        stepsPerFeature: { type: 'integer', minimum: 2, default: 10, description: 'automatic step: steps across the fastest source feature' },
        record: { type: 'integer', minimum: 1, default: 1, description: 'record every k-th step' },
        delays: { enum: ['interpolate', 'round'], default: 'interpolate', description: 'how delays that are not whole steps are handled' },
      },
    },
    lines: {
      type: 'object',
      minProperties: 1,
      propertyNames: id,
      additionalProperties: {
        type: 'object',
        required: ['from', 'to'],
        anyOf: [{ required: ['length'] }, { required: ['stretches'] }],
        additionalProperties: false,
        properties: {
          from: { ...id, description: 'junction at z = 0' },
          to: { ...id, description: 'junction at z = length' },
          length: { ...quantity('length', '12m'), description: 'line length; with stretches optional (their sum)' },
          conductors: { type: 'array', items: id, minItems: 1, uniqueItems: true },
          inductance: matrix('H/m', '0.25uH/m'),
          capacitance: matrix('F/m', '100pF/m'),
          resistance: matrix('ohm/m', '10ohm/km'),
          conductance: matrix('S/m', '1uS/m'),
          impedance: quantity('resistance', '50ohm'),
          velocity: { description: 'a speed ("2e8m/s") or a fraction of light speed ("0.66c")', oneOf: [{ type: 'number' }, { type: 'string' }] },
          section: { type: 'object', description: 'cross-section geometry, see the lines package' },
          model: { enum: ['high-frequency', 'frequency-dependent'], default: 'high-frequency', description: 'time-domain model of a line given by a section: its high-frequency L and C, or fitted Yc and propagation function per mode (recursive convolution)' },
          modalFrequency: { ...quantity('frequency', '100kHz'), description: 'frequency of the constant modal transformation of a multiconductor frequency-dependent line; default v / (4 length) of its slowest mode' },
          fdtd: {
            type: 'object',
            additionalProperties: false,
            description: 'step the line by an FDTD (leapfrog) segment',
            properties: { cells: { type: 'integer', minimum: 2, maximum: 1e6, default: 40, description: 'cells over the whole line (at least one per stretch)' } },
          },
          stretches: {
            type: 'array',
            minItems: 1,
            description: 'consecutive uniform stretches from the from end (parameters varying along the line; stepped by FDTD)',
            items: {
              type: 'object',
              required: ['length'],
              additionalProperties: false,
              properties: {
                length: quantity('length', '2m'),
                inductance: matrix('H/m', '0.25uH/m'),
                capacitance: matrix('F/m', '100pF/m'),
                resistance: matrix('ohm/m', '10ohm/km'),
                conductance: matrix('S/m', '1uS/m'),
                impedance: quantity('resistance', '50ohm'),
                velocity: { description: 'a speed ("2e8m/s") or a fraction of light speed ("0.66c")', oneOf: [{ type: 'number' }, { type: 'string' }] },
              },
            },
          },
          taper: {
            type: 'object',
            required: ['impedance', 'velocity'],
            additionalProperties: false,
            description: 'one conductor whose characteristic impedance goes smoothly from the from end to the to end (stepped by FDTD)',
            properties: {
              impedance: { type: 'array', minItems: 2, maxItems: 2, items: quantity('resistance', '50ohm'), description: '[at the from end, at the to end]' },
              velocity: { description: 'a speed ("2e8m/s") or a fraction of light speed ("0.66c")', oneOf: [{ type: 'number' }, { type: 'string' }] },
              shape: { enum: ['exponential', 'linear'], default: 'exponential', description: 'exponential: ln Z linear in z; linear: Z linear in z' },
            },
          },
        },
      },
    },
    junctions: {
      type: 'object',
      minProperties: 1,
      propertyNames: id,
      additionalProperties: {
        type: 'object',
        required: ['nodes'],
        additionalProperties: false,
        properties: {
          nodes: {
            type: 'object',
            minProperties: 1,
            propertyNames: { ...id, not: { const: 'ref' } },
            additionalProperties: {
              description: 'line-end conductors on this node: "line.conductor", "line.from.conductor", or "line" for one conductor',
              oneOf: [{ type: 'array', items: { type: 'string' } }, { type: 'string' }, { type: 'null' }],
            },
          },
          parts: {
            type: 'object',
            propertyNames: id,
            additionalProperties: {
              type: 'object',
              required: ['between'],
              properties: {
                load: { type: 'string', description: 'registered load type' },
                source: { type: 'string', description: 'registered source (waveform) type' },
                between: { type: 'array', items: { type: 'string' }, minItems: 2, maxItems: 2, description: '[plus, minus]: nodes of this junction or "ref"' },
                drive: { enum: ['voltage', 'current'], default: 'voltage' },
                resistance: quantity('resistance', '50ohm'),
              },
              oneOf: [{ required: ['load'] }, { required: ['source'] }],
              additionalProperties: true,
            },
          },
        },
      },
    },
    probes: {
      type: 'object',
      propertyNames: id,
      additionalProperties: { type: 'object', required: ['probe'], properties: { probe: { type: 'string' } }, additionalProperties: true },
    },
  },
} as const;
