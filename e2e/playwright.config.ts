import { defineConfig } from '@playwright/test';

// The built server (which also serves the built frontend) on its own port and its own database.
// scripts/test.mjs prepares both and passes the database settings in the environment.
const port = Number(process.env.FIELDBOUND_E2E_PORT ?? 3100);

export default defineConfig({
  testDir: './tests',
  outputDir: './test-results',
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [['list'], ['json', { outputFile: 'test-results/report.json' }]],
  use: {
    baseURL: `http://127.0.0.1:${port}`,
    // Debian's Chromium: Playwright's own browser download cannot work on this network.
    launchOptions: { executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium' },
    trace: 'retain-on-failure',
  },
  webServer: {
    command: 'node ../backend/dist/main.js',
    url: `http://127.0.0.1:${port}/api/health`,
    reuseExistingServer: false,
    timeout: 60_000,
    env: { ...process.env, FIELDBOUND_PORT: String(port) } as Record<string, string>,
    stdout: 'ignore',
    stderr: 'pipe',
  },
});
