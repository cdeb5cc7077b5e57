import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['src/**/*.test.ts', 'test/**/*.test.ts'],
    // Engine tests are CPU-bound; two workers match this machine's two cores.
    maxWorkers: 2,
    testTimeout: 60_000,
  },
});
