import { defineConfig, devices } from '@playwright/test';

// The app under test is the production build, started on a port of its own so a running demo is
// untouched. The test command prepares its database and fake services and passes them in the environment.
const port = Number(process.env.E2E_PORT ?? 3100);
const baseURL = `http://127.0.0.1:${port}`;

const chromiumArgs = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-dev-shm-usage',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
];

export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: 'test-results/e2e',
  fullyParallel: false,
  workers: 1,
  retries: 0,
  forbidOnly: Boolean(process.env.CI),
  reporter: [['list'], ['json', { outputFile: 'test-results/playwright.json' }]],
  use: {
    baseURL,
    trace: 'retain-on-failure',
    screenshot: 'only-on-failure',
  },
  projects: [
    {
      name: 'phone',
      // Access rules and the hold race do not depend on the screen: they run once, on the desktop project.
      testIgnore: /(access|race|oversold)\.spec\.ts/,
      use: {
        ...devices['Pixel 7'],
        browserName: 'chromium',
        launchOptions: { executablePath: '/usr/bin/chromium', args: chromiumArgs },
      },
    },
    {
      name: 'desktop',
      use: {
        ...devices['Desktop Chrome'],
        launchOptions: { executablePath: '/usr/bin/chromium', args: chromiumArgs },
      },
    },
  ],
  webServer: {
    command: `node node_modules/next/dist/bin/next start -H 127.0.0.1 -p ${port}`,
    url: `${baseURL}/api/health`,
    reuseExistingServer: false,
    timeout: 60_000,
    stdout: 'ignore',
    stderr: 'pipe',
  },
});
