import { defineConfig } from 'vitest/config';

// Budgets over the build output (dist/), run by scripts/test.sh after `vite build`.
export default defineConfig({
  test: { name: 'build', include: ['tests/build/**/*.test.ts'], environment: 'node' },
});
