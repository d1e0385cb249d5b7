import { defineConfig, devices } from "@playwright/test";

const PORT = Number(process.env.E2E_PORT ?? 3100);
const baseURL = `http://127.0.0.1:${PORT}`;
// A second server on an empty database (no demo seed) for the plant that starts from nothing.
const EMPTY_PORT = PORT + 2;
const emptyURL = `http://127.0.0.1:${EMPTY_PORT}`;
const OWN_PLANT = /own-plant\.spec\.ts$/;

export default defineConfig({
  testDir: "tests/e2e",
  fullyParallel: false,
  workers: 2,
  retries: process.env.CI ? 1 : 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: process.env.CI ? [["list"]] : [["list"], ["html", { open: "never" }]],
  use: {
    baseURL,
    trace: "retain-on-failure",
    launchOptions: {
      // Debian's chromium; Playwright never downloads a browser here.
      executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
      args: [
        "--no-sandbox",
        "--disable-gpu",
        "--disable-quic",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
      ],
    },
  },
  projects: [
    {
      name: "chromium",
      testIgnore: OWN_PLANT,
      use: { ...devices["Desktop Chrome"], viewport: { width: 1280, height: 900 } },
    },
    {
      name: "own-plant",
      testMatch: OWN_PLANT,
      // The walk sets up its installation once: a retry would meet it already set up.
      retries: 0,
      use: {
        ...devices["Desktop Chrome"],
        viewport: { width: 1280, height: 900 },
        baseURL: emptyURL,
      },
    },
  ],
  webServer: [
    {
      command: `npx tsx scripts/e2e-server.ts ${PORT}`,
      url: `${baseURL}/sign-in`,
      timeout: 180_000,
      reuseExistingServer: false,
      stdout: "pipe",
      stderr: "pipe",
    },
    {
      command: `npx tsx scripts/e2e-server.ts ${EMPTY_PORT} --empty`,
      // /sign-in on an empty installation redirects to /set-up: either answer means it is serving.
      url: `${emptyURL}/sign-in`,
      timeout: 180_000,
      reuseExistingServer: false,
      stdout: "pipe",
      stderr: "pipe",
    },
  ],
});
