import { defineConfig } from '@playwright/test';
import { loadConfig } from './server/src/config/env';

// npm test sets the test profile's environment before Playwright starts.
const config = loadConfig();
const baseURL = `http://127.0.0.1:${config.PORT}`;

export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: `${config.DATA_DIR}/reports/playwright-output`,
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 30_000,
  use: {
    baseURL,
    headless: true,
    screenshot: 'only-on-failure',
    trace: 'off',
    launchOptions: {
      executablePath: '/usr/bin/chromium',
      args: [
        '--no-sandbox',
        '--disable-gpu',
        '--disable-dev-shm-usage',
        '--disable-quic',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--no-first-run',
      ],
    },
  },
  webServer: {
    command: 'node --import tsx server/src/index.ts',
    url: `${baseURL}/api/health`,
    reuseExistingServer: false,
    timeout: 60_000,
    stdout: 'ignore',
    stderr: 'pipe',
  },
});
