import { defineConfig } from "@playwright/test";

// The server, database and fakes are started by `npm test` (scripts/test.mjs), which passes
// BASE_URL. Debian's Chromium is used; Playwright never downloads a browser here.
export default defineConfig({
  testDir: "tests/e2e",
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 30_000,
  expect: { timeout: 7_000 },
  use: {
    baseURL: process.env.BASE_URL ?? "http://127.0.0.1:5178",
    trace: "off",
    launchOptions: {
      executablePath: "/usr/bin/chromium",
      args: ["--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run", "--disable-quic"],
    },
  },
  projects: [{ name: "chromium", use: { browserName: "chromium" } }],
});
