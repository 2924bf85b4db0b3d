// Runs this package's tests alone (`npx vitest run --config benchmarks/vitest.config.ts` from the
// repository root) until the root config includes benchmarks/src/**/__tests__/*.spec.ts.
import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    root: new URL('..', import.meta.url).pathname,
    include: ['benchmarks/src/**/__tests__/*.spec.ts'],
    testTimeout: 120_000,
    hookTimeout: 60_000,
    pool: 'forks',
  },
});
