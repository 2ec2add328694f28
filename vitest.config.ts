import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';

export default defineConfig({
  plugins: [react()],
  test: {
    env: { TZ: 'UTC' },
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts', 'tests/reference/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        extends: true,
        test: { name: 'client', include: ['tests/client/**/*.test.tsx'], environment: 'jsdom' },
      },
      {
        extends: true,
        test: {
          name: 'server',
          include: ['tests/server/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/setup/global-postgres.ts'],
          testTimeout: 20_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/setup/global-postgres.ts', 'tests/setup/global-build.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          // One browser at a time: two cores are shared with the server under test.
          fileParallelism: false,
        },
      },
    ],
  },
});
