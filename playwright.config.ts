import { defineConfig, devices } from "@playwright/test";

const port = Number(process.env.E2E_PORT ?? 3100);
const baseURL = `http://localhost:${port}`;

// Debian's Chromium, never a downloaded browser; the flags keep it off the closed network.
const launchOptions = {
  executablePath: "/usr/bin/chromium",
  args: [
    "--disable-gpu",
    "--disable-dev-shm-usage",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
    "--no-first-run",
    "--disable-quic",
  ],
};

export default defineConfig({
  testDir: "tests/e2e",
  outputDir: ".test-data/e2e-output",
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  use: { baseURL, launchOptions, screenshot: "only-on-failure", trace: "off" },
  projects: [
    { name: "desktop", use: { ...devices["Desktop Chrome"], launchOptions } },
    { name: "tablet", use: { viewport: { width: 820, height: 1180 }, hasTouch: true, isMobile: false, launchOptions }, grep: /@tablet/ },
  ],
  webServer: {
    command: `node --import tsx scripts/serve.ts`,
    url: `${baseURL}/api/health`,
    reuseExistingServer: !process.env.CI,
    timeout: 60_000,
    env: { ...process.env, APP_URL: baseURL, PORT: String(port), HOST: "127.0.0.1" } as Record<string, string>,
  },
});
