import path from "node:path";
import { defineConfig } from "@playwright/test";
import base from "../../playwright.config";

// The fuzz corpus runs against the same production server set-up as the e2e tests (`next start` on
// TEST_APP_PORT, test database), one worker, no retries: a retry would hide a 5xx.
const root = path.join(__dirname, "..", "..");
const artifacts = path.join(root, "tests", "artifacts");

export default defineConfig({
  ...base,
  testDir: ".",
  testMatch: /.*\.spec\.ts$/,
  outputDir: path.join(artifacts, "playwright-fuzz"),
  timeout: 120_000,
  workers: 1,
  retries: 0,
  reporter: [
    ["list"],
    ["json", { outputFile: process.env.PLAYWRIGHT_JSON_OUTPUT_FILE ?? path.join(artifacts, "playwright-fuzz.json") }],
  ],
  webServer: base.webServer && !Array.isArray(base.webServer) ? { ...base.webServer, cwd: root } : base.webServer,
});
