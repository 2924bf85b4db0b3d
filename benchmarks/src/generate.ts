/**
 * Large generated networks for the stepping benchmark, built directly as the kernels' flat arrays
 * in the same layout as core's Plan (compile.ts), and, for small networks, as a skein scenario
 * object so that a test can check the arrays against the engine's own compile step.
 *
 * A network is first drawn as a `NetworkSpec` (topology, numbering, line types and delays,
 * parts); `buildKernelNet` lays it out as arrays, `toScenarioData` writes it as a scenario.
 * Delays are whole steps (f = 0, the scenario uses `time.delays: round`).
 */
import { decomposeLine, defineLoad, defineSource, PluginRegistry, type ModalLine } from '@skein/core';
import { inverse, Matrix } from 'ml-matrix';

/** Network shape: a random recursive tree or a square grid mesh (loops). */
export type Topology = 'tree' | 'mesh';
/** Junction and line numbering: random order, or breadth-first so neighbours sit near each other. */
export type Numbering = 'random' | 'bfs';

/** What to generate. */
export interface GenerateOptions {
  /** Number of junctions (>= 2). */
  nJunctions: number;
  topology: Topology;
  /** Conductors per line: 1 (scalar kernel) or 4 (general kernel). */
  conductors: 1 | 4;
  numbering: Numbering;
  /** Whole-step delay range of the fastest mode of each line [steps], inclusive. Default 5..200. */
  delayMin?: number;
  delayMax?: number;
  /** PRNG seed. Default 1. */
  seed?: number;
  /** Share of junctions with a resistor from every node to the reference. Default 0.2. */
  loadShare?: number;
  /** Share of junctions with a voltage source behind 50 ohm on the first node (junction 0 always). Default 0.02. */
  sourceShare?: number;
  /** Distinct line cross-sections (L, C pairs). Default 8. */
  lineTypes?: number;
}

/** A drawn network, independent of the array layout. */
export interface NetworkSpec {
  options: Required<GenerateOptions>;
  /** Time step [s] (delays are whole multiples of it for the fastest mode). */
  dtS: number;
  /** Line l joins junction lineFrom[l] (its from end) to lineTo[l]. */
  lineFrom: Int32Array;
  lineTo: Int32Array;
  lineType: Int32Array;
  lineLengthM: Float64Array;
  /** Per line type: per-unit-length L and C (n x n row-major) and their modal decomposition. */
  typeL: Float64Array[];
  typeC: Float64Array[];
  typeModal: ModalLine[];
  /** Resistor to the reference on every node of junction j [ohm], 0 for none. */
  loadOhm: Float64Array;
  /** 1 where junction j has a source on its first node. */
  source: Uint8Array;
}

/** Kernel arrays of a network, laid out as core's Plan, plus counts the benchmark reports. */
export interface KernelNet {
  spec: NetworkSpec;
  conductors: number;
  nJunctions: number;
  nLines: number;
  nPorts: number;
  /** Shortest and longest whole-step delay over all line modes. */
  kMin: number;
  kMax: number;
  /** Largest nB a temporally blocked kernel may use on these rings: every ring holds nextPow2(k + maxBlockSteps + 1) slots. */
  maxBlockSteps: number;
  jPort: Int32Array; jX: Int32Array; jN: Int32Array; jB: Int32Array; jK: Int32Array; jA: Int32Array; jEx: Int32Array;
  pIn: Int32Array; pInMask: Int32Array; pK: Int32Array; pF: Float64Array; pOut: Int32Array; pOutMask: Int32Array;
  pNode: Int32Array; pY2: Float64Array;
  exRow: Int32Array; exSlot: Int32Array; exCoef: Float64Array; slot: Float64Array;
  mat: Float64Array; wave: Float64Array; rhs: Float64Array; inc: Float64Array; x: Float64Array;
}

/** Source resistance of the generated sources [ohm]. */
export const SOURCE_OHM = 50;
/** Amplitude of the generated (constant) sources [V]. */
export const SOURCE_V = 1;
const DT_S = 1e-9;
const V_LINE = 2e8;

/**
 * Seeded PRNG (mulberry32), uniform in [0, 1).
 * @param seed any 32-bit integer.
 * @example const r = createRandom(1); r() // 0.627...
 */
export function createRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function nextPow2(x: number): number {
  let p = 1;
  while (p < x) p <<= 1;
  return p;
}

function shuffle(a: Int32Array, rnd: () => number): void {
  for (let i = a.length - 1; i > 0; i--) {
    const k = Math.floor(rnd() * (i + 1));
    const t = a[i];
    a[i] = a[k];
    a[k] = t;
  }
}

/** Random symmetric positive definite n x n matrix, scale s: s (I + 0.15 G G^T / n), G uniform in [-1, 1]. */
function randomSpd(n: number, s: number, rnd: () => number, spread: number): Matrix {
  const g = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) g.set(i, k, 2 * rnd() - 1);
  const m = g.mmul(g.transpose()).mul(spread / n);
  for (let i = 0; i < n; i++) m.set(i, i, m.get(i, i) + 1);
  return m.mul(s);
}

function flatSym(m: Matrix): Float64Array {
  const n = m.rows;
  const out = new Float64Array(n * n);
  // Symmetrise exactly so the scenario's symmetry check passes bit for bit.
  for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) out[i * n + k] = i <= k ? m.get(i, k) : m.get(k, i);
  return out;
}

/**
 * Draws a network: topology, numbering, line types, delays and parts.
 * @throws Error for fewer than 2 junctions or a delay range below 1 step.
 * @example drawNetwork({ nJunctions: 1000, topology: 'tree', conductors: 1, numbering: 'bfs' }).lineFrom.length // 999
 */
export function drawNetwork(options: GenerateOptions): NetworkSpec {
  const o: Required<GenerateOptions> = {
    delayMin: 5, delayMax: 200, seed: 1, loadShare: 0.2, sourceShare: 0.02, lineTypes: 8, ...options,
  };
  const N = o.nJunctions;
  if (!(N >= 2)) throw new Error(`generate: nJunctions must be at least 2, got ${N}`);
  if (!(o.delayMin >= 1 && o.delayMax >= o.delayMin)) throw new Error(`generate: delay range must satisfy 1 <= delayMin <= delayMax, got ${o.delayMin}..${o.delayMax}`);
  const rnd = createRandom(o.seed);

  // Edges over abstract vertices.
  let ea: Int32Array;
  let eb: Int32Array;
  if (o.topology === 'tree') {
    ea = new Int32Array(N - 1);
    eb = new Int32Array(N - 1);
    for (let i = 1; i < N; i++) {
      ea[i - 1] = Math.floor(rnd() * i);
      eb[i - 1] = i;
    }
  } else {
    const W = Math.ceil(Math.sqrt(N));
    const a: number[] = [];
    const b: number[] = [];
    for (let i = 0; i < N; i++) {
      const r = Math.floor(i / W);
      const c = i % W;
      if (c + 1 < W && i + 1 < N) { a.push(i); b.push(i + 1); }
      if (i + W < N) { a.push(i); b.push(i + W); }
      // A row shorter than W leaves its last vertex's upper neighbour as the only link: still connected.
      void r;
    }
    ea = Int32Array.from(a);
    eb = Int32Array.from(b);
  }
  const E = ea.length;

  // Random labels first (a netlist has no locality), then optionally BFS order.
  const label = new Int32Array(N);
  for (let i = 0; i < N; i++) label[i] = i;
  shuffle(label, rnd);
  let order = label;
  if (o.numbering === 'bfs') {
    const deg = new Int32Array(N + 1);
    for (let e = 0; e < E; e++) { deg[label[ea[e]] + 1]++; deg[label[eb[e]] + 1]++; }
    for (let i = 0; i < N; i++) deg[i + 1] += deg[i];
    const adj = new Int32Array(2 * E);
    const fill = deg.slice(0, N);
    for (let e = 0; e < E; e++) {
      const a = label[ea[e]];
      const b = label[eb[e]];
      adj[fill[a]++] = b;
      adj[fill[b]++] = a;
    }
    const bfs = new Int32Array(N).fill(-1);
    const queue = new Int32Array(N);
    let head = 0;
    let tail = 0;
    let next = 0;
    for (let s = 0; s < N; s++) {
      if (bfs[s] >= 0) continue;
      bfs[s] = next++;
      queue[tail++] = s;
      while (head < tail) {
        const v = queue[head++];
        for (let k = deg[v]; k < deg[v + 1]; k++) {
          const w = adj[k];
          if (bfs[w] < 0) { bfs[w] = next++; queue[tail++] = w; }
        }
      }
    }
    order = new Int32Array(N);
    for (let i = 0; i < N; i++) order[i] = bfs[label[i]];
  }

  // Lines: from = lower junction number. Random numbering: random line order; BFS: by (from, to).
  const lf = new Int32Array(E);
  const lt = new Int32Array(E);
  const perm = new Int32Array(E);
  for (let e = 0; e < E; e++) perm[e] = e;
  const ja = (e: number): number => Math.min(order[ea[e]], order[eb[e]]);
  const jb = (e: number): number => Math.max(order[ea[e]], order[eb[e]]);
  if (o.numbering === 'random') shuffle(perm, rnd);
  else {
    const keys = new Float64Array(E);
    for (let e = 0; e < E; e++) keys[e] = ja(e) * N + jb(e);
    const idx = Array.from(perm).sort((x, y) => keys[x] - keys[y]);
    perm.set(idx);
  }
  for (let l = 0; l < E; l++) { lf[l] = ja(perm[l]); lt[l] = jb(perm[l]); }

  // Line types. One conductor: Z in 30..300 ohm at 2e8 m/s. Four: random SPD C and L = C^-1 / v^2
  // plus a small SPD perturbation, so the four modes travel at slightly different speeds.
  const n = o.conductors;
  const typeL: Float64Array[] = [];
  const typeC: Float64Array[] = [];
  const typeModal: ModalLine[] = [];
  for (let t = 0; t < o.lineTypes; t++) {
    let L: Float64Array;
    let C: Float64Array;
    if (n === 1) {
      const z = 30 + 270 * rnd();
      L = Float64Array.of(z / V_LINE);
      C = Float64Array.of(1 / (z * V_LINE));
    } else {
      const c0 = 60e-12 + 60e-12 * rnd();
      const Cm = randomSpd(n, c0, rnd, 0.15);
      const Lm = inverse(Cm).mul(1 / (V_LINE * V_LINE)).add(randomSpd(n, 0.01 / (V_LINE * V_LINE * c0), rnd, 0.5));
      L = flatSym(Lm);
      C = flatSym(Cm);
    }
    typeL.push(L);
    typeC.push(C);
    typeModal.push(decomposeLine(L, C));
  }
  const lineType = new Int32Array(E);
  const lineLengthM = new Float64Array(E);
  for (let l = 0; l < E; l++) {
    const t = Math.floor(rnd() * o.lineTypes);
    lineType[l] = t;
    const k0 = o.delayMin + Math.floor(rnd() * (o.delayMax - o.delayMin + 1));
    lineLengthM[l] = k0 * DT_S * typeModal[t].velocities[0];
  }

  const loadOhm = new Float64Array(N);
  const source = new Uint8Array(N);
  for (let j = 0; j < N; j++) {
    if (rnd() < o.loadShare) loadOhm[j] = 10 + 990 * rnd();
    if (j === 0 || rnd() < o.sourceShare) source[j] = 1;
  }
  return { options: o, dtS: DT_S, lineFrom: lf, lineTo: lt, lineType, lineLengthM, typeL, typeC, typeModal, loadOhm, source };
}

/** Whole-step delay of mode m of line l, rounded as the engine does with `time.delays: round`. */
function delaySteps(spec: NetworkSpec, l: number, m: number): number {
  const v = spec.typeModal[spec.lineType[l]].velocities[m];
  return Math.max(1, Math.round(spec.lineLengthM[l] / v / spec.dtS));
}

/**
 * Lays a drawn network out as the kernels' flat arrays, exactly as core's compile step would
 * (same port order, same matrix offsets, same stamping order, K from ml-matrix's inverse).
 * @param maxBlockSteps rings hold nextPow2(k + maxBlockSteps + 1) slots, enough for a temporally
 *   blocked kernel advancing up to maxBlockSteps steps per visit; 1 (default) is the engine's layout.
 * @example buildKernelNet(drawNetwork({ nJunctions: 1e3, topology: 'mesh', conductors: 4, numbering: 'bfs' })).nPorts
 */
export function buildKernelNet(spec: NetworkSpec, maxBlockSteps = 1): KernelNet {
  const n = spec.options.conductors;
  const nJ = spec.options.nJunctions;
  const E = spec.lineFrom.length;

  // Rings in line order, per mode forward then backward (as compile.ts).
  const fwdOff = new Int32Array(E * n);
  const bwdOff = new Int32Array(E * n);
  const ringMask = new Int32Array(E * n);
  const modeK = new Int32Array(E * n);
  let waveLen = 0;
  let kMin = Infinity;
  let kMax = 0;
  for (let l = 0; l < E; l++) {
    for (let m = 0; m < n; m++) {
      const q = l * n + m;
      const k = delaySteps(spec, l, m);
      modeK[q] = k;
      kMin = Math.min(kMin, k);
      kMax = Math.max(kMax, k);
      const len = nextPow2(k + Math.max(1, maxBlockSteps) + 1);
      ringMask[q] = len - 1;
      fwdOff[q] = waveLen;
      waveLen += len;
      bwdOff[q] = waveLen;
      waveLen += len;
    }
  }

  // Line ends per junction in line order (the scenario lists them in this order on every node).
  const jDeg = new Int32Array(nJ + 1);
  for (let l = 0; l < E; l++) { jDeg[spec.lineFrom[l] + 1]++; jDeg[spec.lineTo[l] + 1]++; }
  for (let j = 0; j < nJ; j++) jDeg[j + 1] += jDeg[j];
  const endLine = new Int32Array(2 * E);
  const endEnd = new Uint8Array(2 * E);
  const fill = jDeg.slice(0, nJ);
  for (let l = 0; l < E; l++) {
    const a = fill[spec.lineFrom[l]]++;
    endLine[a] = l;
    endEnd[a] = 0;
    const b = fill[spec.lineTo[l]]++;
    endLine[b] = l;
    endEnd[b] = 1;
  }

  const jPort = new Int32Array(nJ + 1);
  const jX = new Int32Array(nJ + 1);
  const jN = new Int32Array(nJ);
  const jB = new Int32Array(nJ);
  const jK = new Int32Array(nJ);
  const jA = new Int32Array(nJ);
  const jEx = new Int32Array(nJ + 1);
  let nPorts = 0;
  let matLen = 0;
  const R = n;
  for (let j = 0; j < nJ; j++) {
    const M = (jDeg[j + 1] - jDeg[j]) * n;
    jPort[j] = nPorts;
    nPorts += M;
    jX[j] = j * R;
    jN[j] = n;
    jB[j] = matLen;
    matLen += R * M;
    jK[j] = matLen;
    matLen += R * R;
    jA[j] = matLen;
    matLen += M * n;
  }
  jPort[nJ] = nPorts;
  jX[nJ] = nJ * R;

  const pIn = new Int32Array(nPorts);
  const pInMask = new Int32Array(nPorts);
  const pK = new Int32Array(nPorts);
  const pF = new Float64Array(nPorts);
  const pOut = new Int32Array(nPorts);
  const pOutMask = new Int32Array(nPorts);
  const pNode = new Int32Array(nPorts);
  const pY2 = new Float64Array(nPorts);
  const mat = new Float64Array(matLen);
  let nEx = 0;
  for (let j = 0; j < nJ; j++) nEx += spec.source[j];
  const exRow = new Int32Array(nEx);
  const exSlot = new Int32Array(nEx);
  const exCoef = new Float64Array(nEx);
  let ex = 0;
  const A = new Float64Array(R * R);
  const m = new Matrix(R, R);
  for (let j = 0; j < nJ; j++) {
    A.fill(0);
    const M = jPort[j + 1] - jPort[j];
    let q = jPort[j];
    let qLocal = 0;
    for (let e = jDeg[j]; e < jDeg[j + 1]; e++) {
      const l = endLine[e];
      const end = endEnd[e];
      const ml = spec.typeModal[spec.lineType[l]];
      for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) A[a * R + b] += ml.Yc[a * n + b];
      for (let md = 0; md < n; md++) {
        const mode = l * n + md;
        const p = q + md;
        pK[p] = modeK[mode];
        pIn[p] = end === 0 ? bwdOff[mode] : fwdOff[mode];
        pOut[p] = end === 0 ? fwdOff[mode] : bwdOff[mode];
        pInMask[p] = ringMask[mode];
        pOutMask[p] = ringMask[mode];
        pNode[p] = n === 1 ? 0 : -1;
        pY2[p] = n === 1 ? 2 / ml.Zm[0] : 0;
      }
      for (let k = 0; k < n; k++) {
        for (let md = 0; md < n; md++) {
          mat[jB[j] + k * M + (qLocal + md)] += (2 * ml.Ti[k * n + md]) / ml.Zm[md];
          mat[jA[j] + (qLocal + md) * n + k] += ml.TvInv[md * n + k];
        }
      }
      q += n;
      qLocal += n;
    }
    // Parts in scenario order: resistors on every node, then the source on node 0.
    jEx[j] = ex;
    if (spec.loadOhm[j] > 0) for (let k = 0; k < n; k++) A[k * R + k] += 1 / spec.loadOhm[j];
    if (spec.source[j]) {
      const g = 1 / SOURCE_OHM;
      A[0] += g;
      exRow[ex] = 0;
      exSlot[ex] = 0;
      exCoef[ex] = g;
      ex++;
    }
    jEx[j + 1] = ex;
    for (let a = 0; a < R; a++) for (let b = 0; b < R; b++) m.set(a, b, A[a * R + b]);
    const K = inverse(m);
    for (let a = 0; a < R; a++) for (let b = 0; b < R; b++) mat[jK[j] + a * R + b] = K.get(a, b);
  }
  const slot = Float64Array.of(SOURCE_V);
  return {
    spec, conductors: n, nJunctions: nJ, nLines: E, nPorts, kMin, kMax, maxBlockSteps: Math.max(1, maxBlockSteps),
    jPort, jX, jN, jB, jK, jA, jEx, pIn, pInMask, pK, pF, pOut, pOutMask, pNode, pY2,
    exRow, exSlot, exCoef, slot, mat, wave: new Float64Array(waveLen), rhs: new Float64Array(R), inc: new Float64Array(nPorts), x: new Float64Array(nJ * R),
  };
}

/** Constant voltage source used by generated scenarios (type `bench-dc`). */
export const benchDcSource = defineSource({
  type: 'bench-dc',
  summary: 'constant voltage from t = 0 (benchmark networks)',
  params: { amplitude: { unit: 'V', summary: 'value', default: SOURCE_V } },
  create: (p) => ({ value: () => p.amplitude }),
});

/** Resistor used by generated scenarios (type `bench-resistor`). */
export const benchResistorLoad = defineLoad({
  type: 'bench-resistor',
  summary: 'resistor (benchmark networks)',
  params: { resistance: { unit: 'ohm', summary: 'R', min: 0, exclusiveMin: true } },
  create: (p) => ({ kind: 'linear', conductanceS: 1 / p.resistance }),
});

/**
 * A plugin registry holding the two part types generated scenarios name.
 * @example resolveScenarioData(toScenarioData(spec, 10), { registry: benchRegistry() })
 */
export function benchRegistry(): PluginRegistry {
  const r = new PluginRegistry();
  r.register(benchDcSource, '@skein/benchmarks/generate.ts');
  r.register(benchResistorLoad, '@skein/benchmarks/generate.ts');
  return r;
}

/**
 * Writes a drawn network as a skein scenario object (plain data, for resolveScenarioData).
 * Meant for small networks: the object grows with the network.
 * @param nSteps steps the scenario runs (time.end = nSteps dt).
 * @example toScenarioData(drawNetwork({ nJunctions: 20, topology: 'tree', conductors: 1, numbering: 'bfs' }), 100)
 */
export function toScenarioData(spec: NetworkSpec, nSteps: number): Record<string, unknown> {
  const n = spec.options.conductors;
  const cond = n === 1 ? ['w'] : Array.from({ length: n }, (_, k) => `c${k + 1}`);
  const jid = (j: number): string => `j${j}`;
  const lines: Record<string, unknown> = {};
  const ends: string[][][] = Array.from({ length: spec.options.nJunctions }, () => cond.map(() => []));
  const mat = (a: Float64Array): number | number[][] => (n === 1 ? a[0] : Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, (i + 1) * n))));
  for (let l = 0; l < spec.lineFrom.length; l++) {
    const t = spec.lineType[l];
    lines[`l${l}`] = {
      from: jid(spec.lineFrom[l]), to: jid(spec.lineTo[l]), length: spec.lineLengthM[l], conductors: cond,
      inductance: mat(spec.typeL[t]), capacitance: mat(spec.typeC[t]),
    };
    cond.forEach((c, k) => {
      ends[spec.lineFrom[l]][k].push(`l${l}.from.${c}`);
      ends[spec.lineTo[l]][k].push(`l${l}.to.${c}`);
    });
  }
  const junctions: Record<string, unknown> = {};
  for (let j = 0; j < spec.options.nJunctions; j++) {
    const nodes: Record<string, string[]> = {};
    cond.forEach((c, k) => { nodes[`n${c}`] = ends[j][k]; });
    const parts: Record<string, unknown> = {};
    if (spec.loadOhm[j] > 0) cond.forEach((c) => { parts[`r${j}${c}`] = { load: 'bench-resistor', between: [`n${c}`, 'ref'], resistance: spec.loadOhm[j] }; });
    if (spec.source[j]) parts[`s${j}`] = { source: 'bench-dc', between: [`n${cond[0]}`, 'ref'], resistance: SOURCE_OHM, amplitude: SOURCE_V };
    junctions[jid(j)] = { nodes, parts };
  }
  return {
    skein: 1,
    title: `generated ${spec.options.topology} of ${spec.options.nJunctions} junctions, ${n} conductor(s)`,
    time: { end: nSteps * spec.dtS, step: spec.dtS, delays: 'round' },
    lines,
    junctions,
  };
}

/**
 * Draws and lays out a network in one call.
 * @example generateKernelNet({ nJunctions: 1e5, topology: 'tree', conductors: 1, numbering: 'bfs' }, 5)
 */
export function generateKernelNet(options: GenerateOptions, maxBlockSteps = 1): KernelNet {
  return buildKernelNet(drawNetwork(options), maxBlockSteps);
}
