import { defineConfig } from 'vitest/config';
import { integrationFiles, missingTools, underCi } from './test/outside-tools.js';

// Outside CI, the integration files whose program is missing are left out (test/integration-setup.ts
// names them at the start); under CI every one runs, and the set-up fails the run first.
const { runnable, blocked } = integrationFiles(underCi() ? [] : missingTools());

export default defineConfig({
  test: {
    setupFiles: ['test/setup.ts'],
    testTimeout: 30000,
    coverage: {
      provider: 'v8',
      include: ['src/**/*.ts'],
      reporter: ['text-summary', 'text'],
      reportsDirectory: 'coverage',
    },
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['test/**/*.test.ts'],
          exclude: [...runnable, ...blocked],
        },
      },
      {
        extends: true,
        test: {
          name: 'integration',
          include: runnable,
          globalSetup: ['test/integration-setup.ts'],
        },
      },
    ],
  },
});
