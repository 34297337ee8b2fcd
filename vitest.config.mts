import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['server/src/**/*.test.ts', 'test/**/*.test.ts'],
    exclude: ['test/e2e/**', 'node_modules/**'],
    benchmark: { include: ['test/bench/**/*.bench.ts'] },
    globalSetup: ['test/globalSetup.ts'],
    testTimeout: 20000,
  },
});
