import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const alias = {
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
  '@': fileURLToPath(new URL('./src', import.meta.url)),
};

// Two projects: pure computations run without a database; server and browser tests share one
// throw-away MariaDB that tests/helpers/global-setup.ts starts and stops.
export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: { name: 'unit', include: ['tests/shared/**/*.test.ts', 'tests/client/**/*.test.ts'], environment: 'node' },
      },
      {
        resolve: { alias },
        test: {
          name: 'server',
          include: ['tests/server/**/*.test.ts', 'tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/helpers/global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 240_000,
          pool: 'forks',
          fileParallelism: false,
        },
      },
    ],
  },
});
