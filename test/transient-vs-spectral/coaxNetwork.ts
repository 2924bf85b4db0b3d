// The branched coax network shared by the transient-vs-spectral suites (frequencyDependent.spec.ts,
// laplace.spec.ts): two coax sections with skin effect and a Djordjevic-Sarkar dielectric stepped
// by the frequency-dependent line model, a lossless stub to a capacitor, a trapezoid source.
export const COAX = `{ kind: coax, innerRadius: 0.405mm, shieldInnerRadius: 1.475mm, dielectric: { relPermittivity: 2.25, lossTangent: 0.002, model: djordjevic-sarkar } }`;

export const NET = `
skein: 1
time: { end: 1.2us, step: 0.5ns }
lines:
  feed: { from: src, to: tee, length: 60m, section: ${COAX}, model: frequency-dependent }
  drop: { from: tee, to: rx, length: 25m, section: ${COAX}, model: frequency-dependent }
  stub: { from: tee, to: cap, length: 3m, impedance: 100ohm, velocity: 0.7c }
junctions:
  src:
    nodes: { s: [feed] }
    parts: { gen: { source: trapezoid, between: [s, ref], amplitude: 2, delay: 5ns, rise: 5ns, width: 40ns, fall: 5ns, resistance: 50ohm } }
  tee:
    nodes: { t: [feed, drop, stub] }
  rx:
    nodes: { r: [drop] }
    parts: { R: { load: resistor, between: [r, ref], resistance: 75ohm } }
  cap:
    nodes: { c: [stub] }
    parts: { C: { load: capacitor, between: [c, ref], capacitance: 10pF } }
probes:
  vs: { probe: node-voltage, node: src.s }
  vt: { probe: node-voltage, node: tee.t }
  vr: { probe: node-voltage, node: rx.r }
  ledger: { probe: energy-ledger }
`;

