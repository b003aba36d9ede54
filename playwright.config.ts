import { defineConfig, devices } from '@playwright/test';

// The e2e suite runs the built app (vite build + the Express server) against its own
// throwaway database, started by scripts/test.sh. Chromium is Debian's, never a download.
const port = Number(process.env.E2E_PORT ?? 3900);
const baseURL = `http://localhost:${port}`;

export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: 'test-results/artifacts',
  timeout: 60_000,
  expect: { timeout: 10_000 },
  fullyParallel: false,
  workers: 1,
  retries: 0,
  use: {
    baseURL,
    trace: 'retain-on-failure',
    screenshot: 'only-on-failure',
    launchOptions: {
      executablePath: '/usr/bin/chromium',
      args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    },
  },
  projects: [{ name: 'chromium', use: { ...devices['Desktop Chrome'], channel: undefined } }],
  webServer: {
    command: 'node --import tsx server/index.ts',
    url: `${baseURL}/api/health`,
    timeout: 120_000,
    reuseExistingServer: false,
    stdout: 'pipe',
    stderr: 'pipe',
    env: {
      NODE_ENV: 'test',
      PORT: String(port),
      HOST: '127.0.0.1',
      APP_URL: baseURL,
      DATABASE_URL: process.env.E2E_DATABASE_URL ?? '',
      DATA_DIR: '.tmp/e2e-data',
      DEMO_PASSWORD: 'spark-demo-2026',
      LOGIN_RATE_LIMIT: '500',
      SERVE_CLIENT: '1',
      LOCAL_FAKES: '1',
    },
  },
});
