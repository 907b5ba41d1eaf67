import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    testTimeout: 120_000,
    pool: 'forks',
    // The JSON report lets .ci/run print the plain "N passed, N failed" line.
    reporters: ['default', 'json'],
    outputFile: { json: '.vitest-report.json' },
  },
});
