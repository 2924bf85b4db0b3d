// Runs the FDTD benchmarks' tests alone (`npx vitest run --config benchmarks/fdtd/vitest.config.ts`
// from the repository root) until the root config includes benchmarks/fdtd/__tests__/*.spec.ts.
import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    root: new URL('../..', import.meta.url).pathname,
    include: ['benchmarks/fdtd/__tests__/*.spec.ts'],
    testTimeout: 120_000,
    hookTimeout: 60_000,
    pool: 'forks',
  },
});
