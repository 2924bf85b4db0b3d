/**
 * Partitioning a network at its lines for a multi-thread run. A line's delay decouples its two
 * ends, so threads that own the two ends of a line only need to meet every K steps, K the
 * shortest whole-step delay among the lines that cross between threads. The partition keeps
 * the work balanced (line-end ports per thread) and, among nearly balanced cuts, prefers the one
 * whose crossing lines are longest. Junctions are first put in breadth-first order so that each
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

function minCrossingDelay(plan: Plan, owner: Int32Array): { K: number; crossing: number } {
  let K = plan.nSteps + 1;
  let crossing = 0;
  plan.scenario.lines.forEach((l, i) => {
    if (owner[l.from] === owner[l.to]) return;
    crossing++;
    for (let m = 0; m < plan.modal[i].n; m++) K = Math.min(K, plan.delays[plan.lineModeOff[i] + m].k);
  });
  return { K, crossing };
}

/**
 * Splits the junctions over `threads` threads.
 * @param balanceSlack how far a cut may move from the balanced position, as a fraction of one share.
 */
export function partitionNetwork(plan: Plan, threads: number, balanceSlack = 0.15): Partition {
  const nJ = plan.nJunctions;
  const order = breadthFirstOrder(plan);
  const weight = (j: number): number => 1 + (plan.jPort[j + 1] - plan.jPort[j]);
  const prefix = new Float64Array(nJ + 1);
  for (let i = 0; i < nJ; i++) prefix[i + 1] = prefix[i] + weight(order[i]);
  const total = prefix[nJ];
  const cuts: number[] = [];
  for (let t = 1; t < threads; t++) {
    const target = (total * t) / threads;
    let best = -1;
    let bestDelay = -1;
    const lo = target - (balanceSlack * total) / threads;
    const hi = target + (balanceSlack * total) / threads;
    // Candidate cut positions within the slack (at most 64, evenly spread), scored by the
    // shortest delay of the lines that cross this one cut.
    const pos = new Int32Array(nJ);
    for (let i = 0; i < nJ; i++) pos[order[i]] = i;
    const cand: number[] = [];
    for (let c = 1; c < nJ; c++) if (prefix[c] >= lo && prefix[c] <= hi) cand.push(c);
    const stride = Math.max(1, Math.ceil(cand.length / 64));
    for (let ci = 0; ci < cand.length; ci += stride) {
      const c = cand[ci];
      let d = Infinity;
      plan.scenario.lines.forEach((l, i) => {
        if ((pos[l.from] < c) === (pos[l.to] < c)) return;
        for (let m = 0; m < plan.modal[i].n; m++) d = Math.min(d, plan.delays[plan.lineModeOff[i] + m].k);
      });
      if (d > bestDelay) { bestDelay = d; best = c; }
    }
    if (best < 0) {
      best = 1;
      while (best < nJ && prefix[best] < target) best++;
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
