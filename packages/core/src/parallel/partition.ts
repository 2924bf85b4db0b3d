/**
 * Partitioning a network at its lines for a multi-thread run. A line's delay decouples its two
 * ends, so threads that own the two ends of a line only need to meet every K steps, K the
 * shortest whole-step delay among the lines that cross between threads. The partition balances
 * the stepping cost of the junctions (junctionCost) and moves a cut off the balanced position only
 * where longer crossing lines save more meetings than the imbalance costs. Junctions are first
 * put in breadth-first order so that each
 * thread's share is a connected piece of the network.
 */
import type { Plan } from '../compile/compile.ts';

/** A partition of the junctions over threads. */
export interface Partition {
  threads: number;
  /** Owning thread of each junction. */
  owner: Int32Array;
  /** Steps between meetings: min whole-step delay of the crossing lines (nSteps + 1 when none cross). */
  K: number;
  /** Lines whose two ends belong to different threads. */
  crossing: number;
  /** Line-end ports per thread. */
  work: number[];
}

/** Breadth-first order of the junctions (each connected piece in turn). */
export function breadthFirstOrder(plan: Plan): Int32Array {
  const nJ = plan.nJunctions;
  const adj: number[][] = Array.from({ length: nJ }, () => []);
  for (const l of plan.scenario.lines) {
    adj[l.from].push(l.to);
    adj[l.to].push(l.from);
  }
  const order = new Int32Array(nJ);
  const seen = new Uint8Array(nJ);
  let head = 0;
  let tail = 0;
  for (let s = 0; s < nJ; s++) {
    if (seen[s]) continue;
    seen[s] = 1;
    order[tail++] = s;
    while (head < tail) {
      const j = order[head++];
      for (const k of adj[j]) if (!seen[k]) { seen[k] = 1; order[tail++] = k; }
    }
  }
  return order;
}

/**
 * Whole-step delay that line i allows between its two ends' threads: its shortest mode delay, or
 * 0 for an FDTD segment or a frequency-dependent line, which is stepped whole (both ends and its
 * state) by one thread and so never crosses.
 */
function crossingDelay(plan: Plan, i: number): number {
  let d = Infinity;
  for (let m = 0; m < plan.modal[i].n; m++) {
    const dl = plan.delays[plan.lineModeOff[i] + m];
    if (dl.fdtd) return 0;
    d = Math.min(d, dl.k);
  }
  return d;
}

function minCrossingDelay(plan: Plan, owner: Int32Array): { K: number; crossing: number } {
  let K = plan.nSteps + 1;
  let crossing = 0;
  plan.scenario.lines.forEach((l, i) => {
    if (owner[l.from] === owner[l.to]) return;
    crossing++;
    K = Math.min(K, crossingDelay(plan, i));
  });
  return { K, crossing };
}

/**
 * Stepping cost per junction (junctionCost), with each FDTD segment's leapfrog (about 4 n^2
 * multiply-adds per cell) and each frequency-dependent line's convolutions (about 40 per mode)
 * charged to the junction at its z = 0 end, whose thread steps it.
 */
export function stepCosts(plan: Plan): Float64Array {
  const c = new Float64Array(plan.nJunctions);
  for (let j = 0; j < plan.nJunctions; j++) c[j] = junctionCost(plan, j);
  const lines = plan.scenario.lines;
  for (const f of plan.fdtd) c[lines[f.line].from] += 4 * f.cells * f.n * f.n;
  for (const f of plan.fdLines) c[lines[f.line].from] += 40 * f.n;
  return c;
}

/** How the cut between threads is chosen. */
export interface PartitionOptions {
  /** How far a cut may move from the balanced position, as a fraction of one share (default 0.15). */
  balanceSlack?: number;
  /** Estimated cost of one line-end port update [s] (default 10 ns). */
  portCostS?: number;
  /** Estimated cost of one meeting of the threads [s] (default 0.2 ms, measured in benchmarks/partition). */
  barrierS?: number;
}

/**
 * Stepping cost of each junction in multiply-adds of its update (junctionStep.ts): incident
 * waves M, right-hand side R M, solve R^2, emitted waves M N, plus R for the history copy of a
 * partitioned run. Balancing on this rather than on port counts keeps mixed networks (one- and
 * four-conductor branches, big and small junctions) even.
 */
export function junctionCost(plan: Plan, j: number): number {
  const M = plan.jPort[j + 1] - plan.jPort[j];
  const R = plan.jX[j + 1] - plan.jX[j];
  const N = plan.jN[j];
  return 1 + M + R * M + R * R + M * N + R;
}

/**
 * Splits the junctions over `threads` threads. Each cut between consecutive threads (in
 * breadth-first order) is placed where the estimated run time is least: the time the larger
 * side spends beyond its even share, plus the meetings that the shortest crossing delay forces
 * (nSteps / K of them, each `barrierS`).
 */
export function partitionNetwork(plan: Plan, threads: number, options: PartitionOptions = {}): Partition {
  const balanceSlack = options.balanceSlack ?? 0.15;
  const barrierS = options.barrierS ?? 2e-4;
  const nJ = plan.nJunctions;
  const order = breadthFirstOrder(plan);
  const prefix = new Float64Array(nJ + 1);
  const costs = stepCosts(plan);
  for (let i = 0; i < nJ; i++) prefix[i + 1] = prefix[i] + costs[order[i]];
  const total = prefix[nJ];
  // Seconds per unit of cost, from the per-port estimate.
  const unitS = ((options.portCostS ?? 10e-9) * Math.max(1, plan.nPorts)) / Math.max(1, total);
  const steps = plan.nSteps + 1;
  const pos = new Int32Array(nJ);
  for (let i = 0; i < nJ; i++) pos[order[i]] = i;
  const cuts: number[] = [];
  for (let t = 1; t < threads; t++) {
    const target = (total * t) / threads;
    const lo = target - (balanceSlack * total) / threads;
    const hi = target + (balanceSlack * total) / threads;
    // The balanced cut, and at most 64 others evenly spread within the slack.
    let balanced = 1;
    while (balanced < nJ - 1 && prefix[balanced] < target) balanced++;
    const cand: number[] = [];
    for (let c = 1; c < nJ; c++) if (prefix[c] >= lo && prefix[c] <= hi) cand.push(c);
    const stride = Math.max(1, Math.ceil(cand.length / 64));
    const tried = [balanced];
    for (let ci = 0; ci < cand.length; ci += stride) tried.push(cand[ci]);
    let best = balanced;
    let bestS = Infinity;
    for (const c of tried) {
      let d = Infinity;
      plan.scenario.lines.forEach((l, i) => {
        if ((pos[l.from] < c) === (pos[l.to] < c)) return;
        d = Math.min(d, crossingDelay(plan, i));
      });
      // A cut through a line stepped whole by one thread is not allowed.
      if (d < 1) continue;
      const meetings = Number.isFinite(d) ? Math.ceil(steps / Math.max(1, d)) : 1;
      const estS = steps * unitS * Math.abs(prefix[c] - target) + meetings * barrierS;
      if (estS < bestS) { bestS = estS; best = c; }
    }
    cuts.push(best);
  }
  const owner = new Int32Array(nJ);
  let t = 0;
  for (let i = 0; i < nJ; i++) {
    while (t < cuts.length && i >= cuts[t]) t++;
    owner[order[i]] = t;
  }
  const work = new Array<number>(threads).fill(0);
  for (let j = 0; j < nJ; j++) work[owner[j]] += plan.jPort[j + 1] - plan.jPort[j];
  const { K, crossing } = minCrossingDelay(plan, owner);
  return { threads, owner, K, crossing, work };
}
