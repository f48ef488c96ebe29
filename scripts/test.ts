// npm test: a throwaway MariaDB (own data dir and port, removed afterwards), migrations up / down to
// zero / up again, seed, the mail fake on test ports, vitest (unit, sim, integration), next build and
// Playwright e2e against `next start`. Prints `N passed, N failed` last; exits non-zero on any failure.
// Developer option: npm test -- --only unit|sim|integration|e2e (repeatable or comma-separated).
// Developer option: npm test -- --only e2e --files tests/e2e/foo.spec.ts,tests/integration/bar.test.ts runs
// only those files (vitest or Playwright by folder) and skips the fuzz, database-kill and load steps.
import fs from "node:fs";
import path from "node:path";
import { createSequelize } from "../lib/db/sequelize";
import { checkDatabase } from "../lib/db/health";
import { migrateDown, migrateUp } from "../lib/db/migrate";
import { runSeeds } from "../lib/db/seed";
import { CHROMIUM, ensureDebianPackages, MARIADB } from "./lib/debian";
import { Lifecycle } from "./lib/lifecycle";
import { startMailFakeIfPresent } from "./lib/mail";
import { bringUpS3Fake } from "./lib/s3";
import { bringUpRedis } from "./lib/redis";
import { destroyDatabase, instancePaths, portInUse, startDatabase } from "./lib/mariadb";
import { hasBuild, nextBin } from "./lib/stack";
import { repoRoot, stackEnv, testStack, pointStorageAt, type Stack } from "./lib/settings";
import { errorMessage, say, warn } from "./lib/log";
import { parseParts, readPlaywrightCounts, readVitestCounts, VITEST_DIRS, type Counts, type Part } from "./lib/test-parts";

interface StepResult {
  name: string;
  state: "pass" | "FAIL" | "skip";
  detail: string;
  seconds: number;
  /** Tests counted from a reporter; a failed step without counts adds one failure to the total. */
  counts?: Counts;
}

const artifacts = path.join(repoRoot, "tests", "artifacts");
const vitestJson = path.join(artifacts, "vitest.json");
const playwrightJson = path.join(artifacts, "playwright.json");

class Harness {
  results: StepResult[] = [];

  async step(name: string, fn: () => Promise<{ ok: boolean; detail?: string; counts?: Counts }>): Promise<boolean> {
    const t0 = Date.now();
    say(`── ${name}`);
    let r: { ok: boolean; detail?: string; counts?: Counts };
    try {
      r = await fn();
    } catch (err) {
      r = { ok: false, detail: errorMessage(err) };
    }
    const seconds = (Date.now() - t0) / 1000;
    this.results.push({ name, state: r.ok ? "pass" : "FAIL", detail: r.detail ?? "", seconds, counts: r.counts });
    if (!r.ok) console.error(`[tautline] FAILED: ${name}${r.detail ? `: ${r.detail}` : ""}`);
    return r.ok;
  }

  skip(name: string, why: string): void {
    this.results.push({ name, state: "skip", detail: why, seconds: 0 });
  }

  /** The closing lines; the last one is the plain total. Returns true when nothing failed. */
  summary(): boolean {
    let passed = 0;
    let failed = 0;
    let uncounted = 0;
    console.log("\n[tautline] summary");
    for (const r of this.results) {
      console.log(`  ${r.state.padEnd(4)}  ${r.name}${r.detail ? ` (${r.detail})` : ""}  ${r.seconds.toFixed(1)} s`);
      if (r.counts) {
        passed += r.counts.passed;
        failed += r.counts.failed;
      }
      if (r.state === "FAIL" && (!r.counts || r.counts.failed === 0)) uncounted += 1;
    }
    if (uncounted) console.log(`  (the failures include ${uncounted} failed harness step(s) that ran no tests)`);
    console.log(`${passed} passed, ${failed + uncounted} failed`);
    return failed + uncounted === 0 && this.results.every((r) => r.state !== "FAIL");
  }
}

/** Refuses to run when a port we need is taken, naming the setting that moves it. */
async function checkPorts(stack: Stack, parts: Set<Part>): Promise<void> {
  const needs: [number, string][] = [
    [stack.db.port, "TEST_DB_PORT"],
    [stack.smtpPort, "TEST_SMTP_PORT"],
    [stack.mailHttpPort, "TEST_MAIL_HTTP_PORT"],
    [stack.s3Port, "TEST_S3_PORT"],
    [stack.redisPort, "TEST_REDIS_PORT"],
  ];
  if (parts.has("e2e")) needs.push([stack.appPort, "TEST_APP_PORT"]);
  for (const [port, name] of needs) {
    if (await portInUse(port)) throw new Error(`port ${port} is in use: stop what uses it or set ${name} to a free port`);
  }
}

/** One test run per data dir at a time; a lock left by a dead run is taken over (its leftovers removed). */
function takeLock(stack: Stack, life: Lifecycle): void {
  const lock = `${stack.dataDir}.lock`;
  try {
    const pid = Number(fs.readFileSync(lock, "utf8"));
    if (pid && pid !== process.pid) {
      try {
        process.kill(pid, 0);
        throw new Error(`another npm test (pid ${pid}) uses TEST_DB_PORT=${stack.db.port}: wait for it or set TEST_DB_PORT`);
      } catch (err) {
        if ((err as NodeJS.ErrnoException).code !== "ESRCH") throw err;
      }
    }
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== "ENOENT") throw err;
  }
  fs.mkdirSync(path.dirname(lock), { recursive: true });
  fs.writeFileSync(lock, String(process.pid));
  life.onStop("test lock", async () => fs.rmSync(lock, { force: true }));
}

/**
 * `--only fuzz` (npm run test:fuzz): database, build and the full malformed-request corpus only. The
 * short corpus, the database fault test and a short load run follow the e2e step in every full run.
 */
function fuzzOnly(argv: string[]): boolean {
  const named = argv.flatMap((a, i) => (a === "--only" ? (argv[i + 1] ?? "").split(",") : a.startsWith("--only=") ? a.slice(7).split(",") : []));
  if (!named.includes("fuzz")) return false;
  if (named.some((n) => n.trim() && n.trim() !== "fuzz")) throw new Error("--only fuzz runs alone (npm run test:fuzz)");
  return true;
}

/** A script that checks one thing and exits 0 when it holds: counted as one test. */
/** `--files a,b` (or `--files=a,b`): only these test files; null when not given. */
function filesOption(argv: string[]): string[] | null {
  const named = argv.flatMap((a, i) => (a === "--files" ? (argv[i + 1] ?? "").split(",") : a.startsWith("--files=") ? a.slice(8).split(",") : []));
  const list = named.map((f) => f.trim()).filter(Boolean);
  return list.length ? list : null;
}

async function scriptStep(life: Lifecycle, env: NodeJS.ProcessEnv, file: string, args: string[] = []) {
  const code = await life.run(process.execPath, [path.join(repoRoot, "node_modules", "tsx", "dist", "cli.mjs"), file, ...args], { cwd: repoRoot, env });
  return { ok: code === 0, detail: code === 0 ? "" : `exit ${code}`, counts: code === 0 ? { passed: 1, failed: 0 } : { passed: 0, failed: 1 } };
}

async function main(): Promise<boolean> {
  const onlyFuzz = fuzzOnly(process.argv.slice(2));
  const files = filesOption(process.argv.slice(2));
  const parts = onlyFuzz ? new Set<Part>(["e2e"]) : parseParts(process.argv.slice(2));
  const life = new Lifecycle();
  life.watchLauncher();
  const h = new Harness();
  const stack = testStack();
  const env = stackEnv(stack);
  const needDb = parts.has("integration") || parts.has("e2e");
  fs.mkdirSync(artifacts, { recursive: true });
  say(`running: ${[...parts].join(", ")}`);

  try {
    const ready = !needDb
      ? true
      : await h.step("test database and mail fake", async () => {
          await ensureDebianPackages(parts.has("e2e") ? [MARIADB, CHROMIUM] : [MARIADB]);
          takeLock(stack, life);
          const p = instancePaths(stack.dataDir);
          await destroyDatabase(p); // leftovers of an interrupted run
          await checkPorts(stack, parts);
          life.onStop("test database", async () => {
            say("removing the test database");
            await destroyDatabase(p);
          });
          await startDatabase({ dataDir: stack.dataDir, config: stack.db });
          fs.rmSync(stack.mailDir, { recursive: true, force: true });
          const fake = await startMailFakeIfPresent(stack);
          if (fake) life.onStop("mail fake", () => fake.close());
          fs.rmSync(stack.s3Dir, { recursive: true, force: true });
          life.onStop("S3 folder", async () => fs.rmSync(stack.s3Dir, { recursive: true, force: true }));
          await bringUpS3Fake(stack, life);
          fs.rmSync(stack.redisDir, { recursive: true, force: true });
          life.onStop("Redis folder", async () => fs.rmSync(stack.redisDir, { recursive: true, force: true }));
          await bringUpRedis(stack.redisPort, stack.redisDir, life);
          life.onStop("mail folder", async () => fs.rmSync(stack.mailDir, { recursive: true, force: true }));
          return { ok: true, detail: `MariaDB on ${stack.db.port}${fake ? `, mail fake on ${stack.smtpPort}/${stack.mailHttpPort}` : ""}` };
        });

    let schemaOk = ready;
    if (needDb && ready) {
      const sequelize = createSequelize(stack.db);
      try {
        schemaOk = await h.step("migrations: up, down to zero, up again", async () => {
          await checkDatabase(sequelize, stack.db);
          const up = await migrateUp(sequelize);
          const down = await migrateDown(sequelize, { to: 0 });
          const again = await migrateUp(sequelize);
          const ok = up.length === down.length && up.length === again.length;
          return { ok, detail: `${up.length} up, ${down.length} down, ${again.length} up` };
        });
        schemaOk =
          schemaOk &&
          (await h.step("seed", async () => {
            pointStorageAt(stack);
            const steps = await runSeeds(sequelize);
            return { ok: true, detail: `${steps.length} step(s)` };
          }));
      } finally {
        await sequelize.close();
      }
    }

    const vitestDirs = VITEST_DIRS.filter(([part]) => parts.has(part));
    if (vitestDirs.length && !life.interrupted) {
      const names = vitestDirs.map(([part]) => part).join(", ");
      if (parts.has("integration") && !schemaOk) {
        h.skip(`vitest (${names})`, "the test database is not ready");
      } else {
        await h.step(`vitest (${names})`, async () => {
          fs.rmSync(vitestJson, { force: true });
          const filters = files
            ? files.filter((f) => !f.startsWith("tests/e2e"))
            : vitestDirs.length === VITEST_DIRS.length
              ? []
              : vitestDirs.map(([, dir]) => dir);
          const code = await life.run(
            process.execPath,
            [
              path.join(repoRoot, "node_modules", "vitest", "vitest.mjs"),
              "run",
              ...filters,
              "--passWithNoTests",
              "--reporter=default",
              "--reporter=json",
              `--outputFile.json=${vitestJson}`,
            ],
            { cwd: repoRoot, env },
          );
          const counts = readVitestCounts(vitestJson);
          if (!counts) return { ok: false, detail: `vitest exited ${code} without a report` };
          return { ok: code === 0 && counts.failed === 0, detail: `${counts.passed} passed, ${counts.failed} failed`, counts };
        });
      }
    }

    if (parts.has("e2e") && !life.interrupted) {
      if (!schemaOk) {
        h.skip("next build", "the test database is not ready");
        h.skip("playwright e2e", "the test database is not ready");
      } else {
        const skipBuild = process.env.TAUTLINE_SKIP_BUILD === "1" && hasBuild();
        if (skipBuild) warn("TAUTLINE_SKIP_BUILD=1: testing the existing build in .next/");
        const built = skipBuild
          ? true
          : await h.step("next build", async () => {
              const code = await life.run(process.execPath, [nextBin, "build"], { cwd: repoRoot, env });
              return { ok: code === 0, detail: code === 0 ? "" : `exit ${code}` };
            });
        if (!built) {
          h.skip("playwright e2e", "the build failed");
        } else if (!life.interrupted && !onlyFuzz) {
          await h.step("playwright e2e", async () => {
            fs.rmSync(playwrightJson, { force: true });
            const code = await life.run(
              process.execPath,
              [
                path.join(repoRoot, "node_modules", "@playwright", "test", "cli.js"),
                "test",
                "--pass-with-no-tests",
                ...(files ? files.filter((f) => f.startsWith("tests/e2e")) : []),
              ],
              { cwd: repoRoot, env: { ...env, PLAYWRIGHT_JSON_OUTPUT_FILE: playwrightJson } },
            );
            const counts = readPlaywrightCounts(playwrightJson);
            if (!counts) return { ok: false, detail: `playwright exited ${code} without a report` };
            return { ok: code === 0 && counts.failed === 0, detail: `${counts.passed} passed, ${counts.failed} failed`, counts };
          });
        }
        if (built && !life.interrupted && !files) {
          const fuzzJson = path.join(artifacts, "playwright-fuzz.json");
          await h.step(onlyFuzz ? "malformed-request corpus (full)" : "malformed-request corpus (short)", async () => {
            fs.rmSync(fuzzJson, { force: true });
            const code = await life.run(
              process.execPath,
              [path.join(repoRoot, "node_modules", "@playwright", "test", "cli.js"), "test", "-c", "tests/fuzz/playwright.config.ts"],
              { cwd: repoRoot, env: { ...env, PLAYWRIGHT_JSON_OUTPUT_FILE: fuzzJson, FUZZ_FULL: onlyFuzz ? "1" : "0" } },
            );
            const counts = readPlaywrightCounts(fuzzJson);
            if (!counts) return { ok: false, detail: `playwright exited ${code} without a report` };
            return { ok: code === 0 && counts.failed === 0, detail: `${counts.passed} passed, ${counts.failed} failed`, counts };
          });
        }
        if (built && !onlyFuzz && !files && !life.interrupted) {
          // Own MariaDB and server on their own ports: the kill never touches the shared test database.
          // Ports follow the test ports (+20, +30), so two checkouts with different TEST_* ports never collide.
          const faultEnv = {
            ...env,
            FAULT_DB_PORT: process.env.FAULT_DB_PORT ?? String(stack.db.port + 20),
            FAULT_APP_PORT: process.env.FAULT_APP_PORT ?? String(stack.appPort + 20),
          };
          await h.step("database kill during writes (own MariaDB)", () => scriptStep(life, faultEnv, "tests/reliability/db-fault.ts"));
        }
        if (built && !onlyFuzz && !files && !life.interrupted) {
          const loadEnv = {
            ...env,
            LOAD_DB_PORT: process.env.LOAD_DB_PORT ?? String(stack.db.port + 30),
            LOAD_APP_PORT: process.env.LOAD_APP_PORT ?? String(stack.appPort + 30),
          };
          await h.step("load, short form (own MariaDB)", () => scriptStep(life, loadEnv, "scripts/load.ts", ["--short"]));
        }
      }
    }
  } finally {
    await life.stop();
  }
  return h.summary();
}

main()
  .then((ok) => process.exit(ok ? 0 : 1))
  .catch((err) => {
    console.error(`[tautline] ${errorMessage(err)}`);
    console.log("0 passed, 1 failed");
    process.exit(1);
  });
