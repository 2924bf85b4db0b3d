/**
 * Runs `skein sweep` directly: `npx tsx packages/sweep/src/main.ts SWEEP.yaml --workers 2`
 * (the `skein` command calls sweepCommand itself; this entry serves scripts and tests).
 */
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { sweepCommand } from './command.ts';

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  process.exitCode = await sweepCommand(process.argv.slice(2), {
    out: (s) => process.stdout.write(s.endsWith('\n') ? s : `${s}\n`),
    err: (s) => process.stderr.write(s.endsWith('\n') ? s : `${s}\n`),
  });
}
