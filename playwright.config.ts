import { defineConfig } from '@playwright/test';

/**
 * End-to-end journeys in Debian's Chromium (never a downloaded browser) against the production build
 * that docker-free-start.sh test starts on PUBLIC_BASE_URL.
 */
export default defineConfig({
  testDir: 'e2e',
  workers: 1,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  outputDir: process.env.LOSSLINE_TEST_DIR ? `${process.env.LOSSLINE_TEST_DIR}/playwright-artifacts` : 'test-results',
  use: {
    baseURL: process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4331',
    screenshot: 'only-on-failure',
    trace: 'retain-on-failure',
    launchOptions: {
      executablePath: '/usr/bin/chromium',
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-dev-shm-usage',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--no-first-run',
        '--disable-quic',
      ],
    },
  },
});
