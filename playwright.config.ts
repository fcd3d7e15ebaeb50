import { defineConfig } from '@playwright/test';

// Debian's Chromium only; no browser is ever downloaded.
const PORT = Number(process.env.E2E_PORT ?? 3100);
export default defineConfig({
  testDir: 'tests/e2e',
  workers: 1,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [['list'], ['json']],
  outputDir: '.tmp/e2e-output',
  use: {
    baseURL: `http://127.0.0.1:${PORT}`,
    viewport: { width: 1024, height: 768 },
    launchOptions: {
      executablePath: '/usr/bin/chromium',
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    },
    trace: 'off',
    screenshot: 'only-on-failure',
  },
  webServer: {
    command: `npx tsx server/index.ts`,
    url: `http://127.0.0.1:${PORT}/api/health`,
    reuseExistingServer: false,
    timeout: 60_000,
    env: {
      NODE_ENV: 'test',
      DATABASE_URL: process.env.E2E_DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54339/hoodline_e2e',
      PORT: String(PORT),
      SERVE_DIST: '1',
      SEED_DEMO: '1',
      SMTP_PORT: process.env.E2E_SMTP_PORT ?? '2626',
      PHOTO_DIR: '.tmp/e2e-photos',
      SESSION_SECRET: 'e2e-only-secret-0123456789',
      // The flows sign in dozens of times from one address; the limit itself is tested in tests/integration/auth.test.ts.
      LOGIN_RATE_LIMIT: '10000',
    },
  },
});
