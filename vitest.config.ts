import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const alias = { '@shared': fileURLToPath(new URL('./shared', import.meta.url)) };

// Two projects: `unit` (pure shared/ and client logic) and `api` (supertest against the real
// PostgreSQL that scripts/test.sh starts). The API project runs files one at a time because
// each file truncates the tables it uses.
export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: { name: 'unit', include: ['tests/shared/**/*.test.ts', 'tests/client/**/*.test.ts', 'tests/lint/**/*.test.ts', 'content/**/*.test.ts'], testTimeout: 20_000, environment: 'node' },
      },
      {
        resolve: { alias },
        test: {
          name: 'api',
          include: ['tests/server/**/*.test.ts'],
          environment: 'node',
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
    ],
  },
});
