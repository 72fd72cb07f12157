import { defineConfig } from '@playwright/test'

// Debian's Chromium (never a downloaded browser); scripts/test.sh starts the built server
// against the throwaway test database and sets KW_BASE_URL.
export default defineConfig({
  testDir: 'tests/browser',
  timeout: 60_000,
  expect: { timeout: 10_000 },
  fullyParallel: false,
  workers: 1,
  reporter: [['list']],
  outputDir: 'test-results',
  use: {
    baseURL: process.env.KW_BASE_URL ?? 'http://127.0.0.1:3000',
    viewport: { width: 1366, height: 860 },
    screenshot: 'only-on-failure',
    launchOptions: {
      executablePath: process.env.KW_CHROMIUM ?? '/usr/bin/chromium',
      args: ['--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'],
    },
  },
})
