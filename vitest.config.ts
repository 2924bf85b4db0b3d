import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['packages/*/src/**/__tests__/*.spec.ts', 'plugins/*/src/**/__tests__/*.spec.ts', 'test/**/*.spec.ts', 'benchmarks/src/**/__tests__/*.spec.ts', 'benchmarks/fdtd/__tests__/*.spec.ts'],
    testTimeout: 60_000,
    hookTimeout: 60_000,
    pool: 'forks',
  },
});
