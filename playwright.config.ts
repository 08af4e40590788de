import { defineConfig, devices } from "@playwright/test";

// End-to-end tests against `next start` on the seeded e2e database, in Debian's Chromium
// (nothing is downloaded). Run `npm run build` first; scripts/test.sh does it in order.
const PORT = Number(process.env.E2E_PORT ?? 3100);
const BASE_URL = `http://127.0.0.1:${PORT}`;
const E2E_DATABASE_URL = process.env.E2E_DATABASE_URL ?? "postgres://postgres@127.0.0.1:54329/undertone_e2e";
const NEXTAUTH_SECRET = process.env.NEXTAUTH_SECRET ?? "undertone-test-secret-not-for-use";

const chromium = {
  ...devices["Desktop Chrome"],
  launchOptions: {
    executablePath: "/usr/bin/chromium",
    args: [
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
      "--disable-dev-shm-usage",
    ],
  },
};

export default defineConfig({
  testDir: "tests/e2e",
  outputDir: "test-results",
  fullyParallel: false,
  workers: 1,
  // One retry: a test that passes only on its second try is reported as flaky, not hidden.
  retries: 1,
  forbidOnly: true,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [["list"]],
  use: {
    baseURL: BASE_URL,
    trace: "retain-on-failure",
    screenshot: "only-on-failure",
    locale: "en-GB",
    timezoneId: "Europe/London",
  },
  projects: [
    { name: "setup", testMatch: /auth\.setup\.ts/, use: chromium },
    // Starts a second server beside the web server: run once, not per viewport.
    { name: "instances", testMatch: /instances\.spec\.ts/, use: chromium },
    {
      name: "phone",
      testMatch: /.*\.spec\.ts/,
      testIgnore: /instances\.spec\.ts/,
      dependencies: ["setup"],
      use: { ...chromium, viewport: { width: 390, height: 844 }, deviceScaleFactor: 2, isMobile: true, hasTouch: true },
    },
    {
      name: "desktop",
      testMatch: /.*\.spec\.ts/,
      testIgnore: /instances\.spec\.ts/,
      dependencies: ["setup"],
      use: { ...chromium, viewport: { width: 1280, height: 800 } },
    },
  ],
  webServer: {
    // A long keep-alive, so a test's request never reuses a socket the server is just closing (ECONNRESET).
    command: `node node_modules/next/dist/bin/next start -H 127.0.0.1 -p ${PORT} --keepAliveTimeout 120000`,
    url: `${BASE_URL}/api/health`,
    reuseExistingServer: false,
    timeout: 60_000,
    stdout: "pipe",
    stderr: "pipe",
    env: {
      DATABASE_URL: E2E_DATABASE_URL,
      NEXTAUTH_URL: BASE_URL,
      APP_URL: BASE_URL,
      NEXTAUTH_SECRET,
      AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: "true",
    },
  },
});
