/**
 * Progress for long work: a bar with an ETA on a terminal, plain lines otherwise. Shown only when
 * the work lasts longer than about a second.
 */

/** A progress reporter; `update` takes the fraction done, `done` closes it. */
export interface Progress {
  update(fraction: number): void;
  done(): void;
}

/**
 * Creates a progress reporter writing to `stream`.
 * @param label what is running.
 * @param stream where to write (stderr by default, so stdout stays clean for data).
 */
export function createProgress(label: string, stream: NodeJS.WriteStream = process.stderr, quiet = false): Progress {
  const start = Date.now();
  const tty = stream.isTTY === true;
  let lastLine = -1;
  let drawn = false;
  return {
    update(fraction: number) {
      if (quiet) return;
      const elapsed = (Date.now() - start) / 1000;
      if (elapsed < 1 && fraction < 1) return;
      const eta = fraction > 0 ? (elapsed / fraction) * (1 - fraction) : 0;
      if (tty) {
        const width = 30;
        const full = Math.round(fraction * width);
        stream.write(`\r${label} [${'#'.repeat(full)}${'.'.repeat(width - full)}] ${(fraction * 100).toFixed(0).padStart(3)} %  eta ${eta.toFixed(1)} s `);
        drawn = true;
      } else {
        const decile = Math.floor(fraction * 10);
        if (decile > lastLine) {
          lastLine = decile;
          stream.write(`${label}: ${decile * 10} % (${elapsed.toFixed(1)} s elapsed, about ${eta.toFixed(1)} s left)\n`);
        }
      }
    },
    done() {
      if (drawn) stream.write('\n');
    },
  };
}
