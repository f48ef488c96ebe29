import path from "node:path";
import { defineConfig } from "@playwright/test";

// npm test sets these (scripts/test.ts); the defaults match it so `npx playwright test` works against
// a test database that is already running.
const appPort = Number(process.env.TEST_APP_PORT ?? 3100);
const baseURL = `http://127.0.0.1:${appPort}`;
const inCi = !!process.env.CI;
const artifacts = path.join(__dirname, "tests", "artifacts");

const serverEnv: Record<string, string> = {
  ...(process.env as Record<string, string>),
  NODE_ENV: "production",
  PORT: String(appPort),
  NEXTAUTH_URL: process.env.NEXTAUTH_URL ?? baseURL,
  DB_HOST: process.env.DB_HOST ?? "127.0.0.1",
  DB_PORT: process.env.DB_PORT ?? process.env.TEST_DB_PORT ?? "3308",
  SMTP_URL: process.env.SMTP_URL ?? `smtp://127.0.0.1:${process.env.TEST_SMTP_PORT ?? 2526}`,
  MAIL_FAKE_URL: process.env.MAIL_FAKE_URL ?? `http://127.0.0.1:${process.env.TEST_MAIL_HTTP_PORT ?? 1081}`,
};

export default defineConfig({
  testDir: "tests/e2e",
  outputDir: path.join(artifacts, "playwright"),
  timeout: 30_000,
  expect: { timeout: 7_000 },
  fullyParallel: false,
  forbidOnly: inCi,
  workers: inCi ? 1 : 2,
  retries: inCi ? 0 : 1,
  reporter: [
    ["list"],
    ["json", { outputFile: process.env.PLAYWRIGHT_JSON_OUTPUT_FILE ?? path.join(artifacts, "playwright.json") }],
  ],
  use: {
    baseURL,
    browserName: "chromium",
    // Debian's Chromium, installed by npm test with apt-get: no browser download.
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
      args: [
        "--headless",
        "--no-sandbox",
        "--disable-gpu",
        "--disable-quic",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
      ],
    },
    screenshot: "only-on-failure",
    trace: "retain-on-failure",
  },
  webServer: {
    command: `node node_modules/next/dist/bin/next start -p ${appPort} -H 127.0.0.1`,
    url: baseURL,
    env: serverEnv,
    // Never test a server someone else left running (opt in locally with PW_REUSE_SERVER=1).
    reuseExistingServer: !inCi && process.env.PW_REUSE_SERVER === "1",
    timeout: 120_000,
    stdout: "pipe",
    stderr: "pipe",
  },
});
