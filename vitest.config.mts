import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const root = fileURLToPath(new URL('.', import.meta.url));

// Three projects: pure unit tests (analysis and friends), integration tests against the real
// PostgreSQL started by scripts/test.mjs, and browser tests driving Debian's Chromium.
export default defineConfig({
  resolve: {
    alias: {
      '@/': root,
      'server-only': path.join(root, 'node_modules/server-only/empty.js'),
    },
  },
  test: {
    pool: 'forks',
    maxWorkers: 2,
    testTimeout: 20_000,
    hookTimeout: 60_000,
    // EMBERLINE_ANALYSIS_THREADS=0: app/_lib code called inside a test runs its analysis tasks in-process (tests only; see app/_lib/server/analysis-pool.ts)
    env: { TZ: 'UTC', EMBERLINE_ANALYSIS_THREADS: '0' },
    projects: [
      {
        extends: true,
        test: { name: 'unit', include: ['test/analysis/**/*.test.ts', 'test/unit/**/*.test.ts'] },
      },
      {
        extends: true,
        test: {
          name: 'integration',
          include: ['test/app/**/*.test.ts'],
          fileParallelism: false,
        },
      },
      {
        extends: true,
        test: {
          name: 'browser',
          include: ['test/e2e/**/*.test.ts'],
          fileParallelism: false,
          testTimeout: 120_000,
        },
      },
    ],
  },
});
