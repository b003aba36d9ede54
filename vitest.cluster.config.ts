import { defineConfig } from 'vitest/config';

// The cluster test (tests/cluster/), run by scripts/test.sh (short) and npm run verify:cluster (full);
// it starts scripts/cluster.sh itself.
export default defineConfig({
  test: { name: 'cluster', include: ['tests/cluster/**/*.test.ts'], environment: 'node', fileParallelism: false },
});
