/**
 * The sweep's progress line: a bar with cases done, failures and an ETA on a terminal, a plain
 * line every tenth of the way otherwise (logs of batch jobs stay short).
 */
import type { SweepProgress } from './sweep.ts';

/** A progress reporter for sweeps. */
export interface SweepProgressBar {
  update(p: SweepProgress): void;
  done(): void;
}

/**
 * Formats one progress line.
 * @example formatProgress({ done: 50, total: 200, computed: 50, failed: 1, etaS: 12 }) // "[#######.......] 50/200 cases, 1 failed, eta 12 s"
 */
export function formatProgress(p: SweepProgress, width = 30): string {
  const f = p.total > 0 ? p.done / p.total : 1;
  const full = Math.round(f * width);
  const eta = Number.isFinite(p.etaS) ? `eta ${p.etaS < 100 ? p.etaS.toFixed(1) : Math.round(p.etaS)} s` : 'eta -';
  return `[${'#'.repeat(full)}${'.'.repeat(width - full)}] ${p.done}/${p.total} cases, ${p.failed} failed, ${eta}`;
}

/**
 * Creates a progress reporter.
 * @param write where text goes (a terminal stream's write, or a line logger).
 * @param tty redraw one line with "\r" (terminal) or print a line per tenth.
 */
export function createSweepProgress(write: (s: string) => void, tty: boolean, quiet = false): SweepProgressBar {
  let lastDecile = -1;
  let lastDraw = 0;
  let drawn = false;
  return {
    update(p) {
      if (quiet) return;
      if (tty) {
        const now = Date.now();
        if (now - lastDraw < 100 && p.done < p.total) return;
        lastDraw = now;
        write(`\rsweep ${formatProgress(p)} `);
        drawn = true;
      } else {
        const decile = p.total > 0 ? Math.floor((10 * p.done) / p.total) : 10;
        if (decile > lastDecile) {
          lastDecile = decile;
          write(`sweep: ${formatProgress(p, 20)}\n`);
        }
      }
    },
    done() {
      if (drawn) write('\n');
    },
  };
}
