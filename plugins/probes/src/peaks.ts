/**
 * Running extremes of a probe's traces, kept in one Float64Array so that sampling allocates nothing.
 */

/** Extremes of one trace, as a probe's structured output reports them. */
export interface TraceExtremes {
  unit: string;
  /** Largest value and its time [s]. */
  max: number;
  maxAtS: number;
  /** Smallest value and its time [s]. */
  min: number;
  minAtS: number;
  /** Largest magnitude (max(|max|, |min|)) and its time [s]. */
  peak: number;
  peakAtS: number;
}

/** Running max / min of n traces. Layout per trace: [max, maxAtS, min, minAtS]. */
export class PeakTracker {
  private readonly data: Float64Array;
  private seen = false;
  constructor(private readonly names: readonly string[], private readonly units: readonly string[]) {
    this.data = new Float64Array(4 * names.length);
    for (let k = 0; k < names.length; k++) {
      this.data[4 * k] = -Infinity;
      this.data[4 * k + 2] = Infinity;
    }
  }

  /** Step hook helper: feeds one value of trace k at time t [s]. Allocates nothing. */
  add(k: number, value: number, tS: number): void {
    const d = this.data;
    const o = 4 * k;
    if (value > d[o]) {
      d[o] = value;
      d[o + 1] = tS;
    }
    if (value < d[o + 2]) {
      d[o + 2] = value;
      d[o + 3] = tS;
    }
    this.seen = true;
  }

  /** Plain-data summary by trace name; empty when nothing was sampled. */
  result(): Record<string, TraceExtremes> {
    const out: Record<string, TraceExtremes> = {};
    if (!this.seen) return out;
    for (let k = 0; k < this.names.length; k++) {
      const d = this.data;
      const o = 4 * k;
      const maxFirst = Math.abs(d[o]) >= Math.abs(d[o + 2]);
      out[this.names[k]] = {
        unit: this.units[k],
        max: d[o],
        maxAtS: d[o + 1],
        min: d[o + 2],
        minAtS: d[o + 3],
        peak: maxFirst ? d[o] : d[o + 2],
        peakAtS: maxFirst ? d[o + 1] : d[o + 3],
      };
    }
    return out;
  }
}
