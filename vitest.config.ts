import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';

// Suites: unit (pure node), component (jsdom + RTL), integration (real PostgreSQL, serial).
// End-to-end flows run under @playwright/test (tests/e2e), driven by scripts/test.ts.
export default defineConfig({
  plugins: [react()],
  test: {
    reporters: ['default', 'json'],
    outputFile: { json: '.tmp/vitest-results.json' },
    projects: [
      { extends: true, test: { name: 'unit', environment: 'node', include: ['tests/unit/**/*.test.ts'] } },
      {
        extends: true,
        test: {
          name: 'component',
          environment: 'jsdom',
          include: ['tests/component/**/*.test.tsx'],
          setupFiles: ['tests/setup-dom.ts'],
        },
      },
      {
        extends: true,
        test: {
          name: 'integration',
          environment: 'node',
          include: ['tests/integration/**/*.test.ts'],
          fileParallelism: false,
          testTimeout: 30000,
          hookTimeout: 60000,
        },
      },
    ],
  },
});
