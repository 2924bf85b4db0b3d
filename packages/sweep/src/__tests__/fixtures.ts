/**
 * Shared test fixtures: the standard plugin registry and the Bewley lattice scenario (a 1 V step
 * behind Rs = 25 ohm into a 50 ohm line of 1 us one-way delay, resistive load).
 */
import { loadPluginModules, PluginRegistry } from '@skein/core';
import { STANDARD_PLUGINS } from '@skein/cli';

let cached: Promise<PluginRegistry> | undefined;

/** The standard plugins, loaded once per test file. */
export function standardRegistry(): Promise<PluginRegistry> {
  cached ??= loadPluginModules(new PluginRegistry(), STANDARD_PLUGINS, import.meta.resolve('@skein/cli'));
  return cached;
}

/** The Bewley lattice case (L. V. Bewley, Trans. AIEE 50, 1931, from memory) as YAML. */
export const BEWLEY_YAML = `skein: 1
title: Bewley lattice
time: { end: 4us, step: 0.05us }
lines:
  tl: { from: S, to: L, length: 200m, impedance: 50ohm, velocity: 2e8m/s }
junctions:
  S:
    nodes: { s: [tl] }
    parts:
      gen: { source: step, between: [s, ref], amplitude: 1, resistance: 25ohm }
  L:
    nodes: { l: [tl] }
    parts:
      RL: { load: resistor, between: [l, ref], resistance: 100ohm }
probes:
  vl: { probe: node-voltage, node: L.l }
  led: { probe: energy-ledger }
`;
