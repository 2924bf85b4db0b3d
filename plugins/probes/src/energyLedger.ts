/**
 * `energy-ledger`: records the engine's energy ledger over time and reports it per part and line.
 */
import { defineProbe, type LedgerView } from '@skein/core';

/** Structured output of the energy ledger probe [J]. */
export interface LedgerOutput {
  [key: string]: unknown;
  /** Energy delivered by each source's EMF, by source id. */
  delivered: Record<string, number>;
  /** Energy taken by each part (dissipated plus stored inside it), by part id. */
  absorbed: Record<string, number>;
  /** Energy stored in each line at the end, by line id. */
  stored: Record<string, number>;
  /** Energy lost in each lossy line (its R and G; for a frequency-dependent line all it took), by line id. */
  lost: Record<string, number>;
  totals: { deliveredJ: number; absorbedJ: number; storedJ: number; lostJ: number; residualJ: number; relativeResidual: number };
}

const toRecord = (m: ReadonlyMap<string, number>): Record<string, number> => Object.fromEntries(m);

/**
 * The energy ledger probe. No params; asks the engine to keep the ledger (ctx.useLedger()).
 * Traces: `delivered`, `absorbed`, `stored`, `residual`, `lost` [J]. Finish output: a LedgerOutput from
 * the last sampled ledger (empty maps and zero totals if nothing was sampled).
 * @example probes: { energy: { probe: energy-ledger } }
 */
export const energyLedgerProbe = defineProbe({
  type: 'energy-ledger',
  summary: 'Energy delivered by sources, absorbed by parts, stored in lines, and the residual',
  params: {},
  create(_p, ctx) {
    ctx.useLedger();
    const td = ctx.trace('delivered', 'J');
    const ta = ctx.trace('absorbed', 'J');
    const ts = ctx.trace('stored', 'J');
    const tr = ctx.trace('residual', 'J');
    const tl = ctx.trace('lost', 'J');
    let last: LedgerView | undefined;
    // A copy of the last totals: the view object may be refreshed after the last sample.
    const totals = new Float64Array(5);
    return {
      sample(state) {
        const l = state.ledger();
        state.record(td, l.deliveredTotalJ);
        state.record(ta, l.absorbedTotalJ);
        state.record(ts, l.storedTotalJ);
        state.record(tr, l.residualJ);
        state.record(tl, l.lostTotalJ);
        totals[4] = l.lostTotalJ;
        totals[0] = l.deliveredTotalJ;
        totals[1] = l.absorbedTotalJ;
        totals[2] = l.storedTotalJ;
        totals[3] = l.residualJ;
        last = l;
      },
      finish(): LedgerOutput {
        const scale = Math.max(Math.abs(totals[0]), Math.abs(totals[1]) + Math.abs(totals[2]) + Math.abs(totals[4]));
        return {
          delivered: last ? toRecord(last.delivered) : {},
          absorbed: last ? toRecord(last.absorbed) : {},
          stored: last ? toRecord(last.stored) : {},
          lost: last ? toRecord(last.lost) : {},
          totals: {
            deliveredJ: totals[0], absorbedJ: totals[1], storedJ: totals[2], lostJ: totals[4], residualJ: totals[3],
            relativeResidual: scale > 0 ? totals[3] / scale : 0,
          },
        };
      },
    };
  },
});
