import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts', 'test/**/*.test.tsx'],
    // The JSON report lets .ci/run print one plain "N passed, N failed" line.
    reporters: ['default', 'json'],
    outputFile: { json: 'test-results/vitest.json' },
    testTimeout: 30_000,
    hookTimeout: 60_000,
  },
});
