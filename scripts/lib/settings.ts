import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { dbConfig, parsePort, type DbConfig, type Env } from "../../lib/db/config";
import { dataDirFromEnv } from "./instance-paths";

export const repoRoot = path.resolve(__dirname, "..", "..");

/** Everything one running copy of Tautline needs: database, app port, mail fake, sign-in settings. */
export interface Stack {
  kind: "demo" | "test";
  db: DbConfig;
  dataDir: string;
  appPort: number;
  appHost: string;
  appUrl: string;
  smtpPort: number;
  mailHttpPort: number;
  smtpUrl: string;
  mailFakeUrl: string;
  /** False when SMTP_URL points at a real provider: then no local fake is started. */
  runMailFake: boolean;
  mailDir: string;
  nextauthSecret: string;
  /** Object storage: the local S3 fake's port and folder, unless S3_ENDPOINT points elsewhere. */
  s3Port: number;
  s3Endpoint: string;
  s3Bucket: string;
  runS3Fake: boolean;
  s3Dir: string;
  /** Queue mode: Redis URL (null = the in-process worker pool), and whether we start redis-server on loopback. */
  redisUrl: string | null;
  redisPort: number;
  runRedis: boolean;
  redisDir: string;
}

/** The loopback port of a redis:// URL, or null for another host. */
function loopbackPort(url: string): number | null {
  return isLoopbackUrl(url) ? Number(new URL(url).port || 6379) : null;
}

function isLoopbackUrl(url: string): boolean {
  try {
    const h = new URL(url).hostname;
    return h === "127.0.0.1" || h === "localhost" || h === "[::1]";
  } catch {
    return false;
  }
}

/** The demo stack (npm start / npm run dev / db:*): ports from PORT, DB_PORT, SMTP_PORT, MAIL_HTTP_PORT. */
export function demoStack(env: Env = process.env): Stack {
  const db = dbConfig(env);
  const appPort = parsePort(env.PORT, "PORT", 3000);
  const smtpPort = parsePort(env.SMTP_PORT, "SMTP_PORT", 2525);
  const mailHttpPort = parsePort(env.MAIL_HTTP_PORT, "MAIL_HTTP_PORT", 1080);
  const smtpUrl = env.SMTP_URL?.trim() || `smtp://127.0.0.1:${smtpPort}`;
  const dataDir = dataDirFromEnv(repoRoot, env, "demo", db.port);
  return {
    kind: "demo",
    db,
    dataDir,
    appPort,
    appHost: env.APP_HOST?.trim() || "127.0.0.1",
    appUrl: env.NEXTAUTH_URL?.trim() || `http://localhost:${appPort}`,
    smtpPort,
    mailHttpPort,
    smtpUrl,
    mailFakeUrl: env.MAIL_FAKE_URL?.trim() || `http://127.0.0.1:${mailHttpPort}`,
    runMailFake: env.MAIL_FAKE !== "0" && isLoopbackUrl(smtpUrl),
    mailDir: path.join(path.dirname(dataDir), `mail-${path.basename(dataDir)}`),
    nextauthSecret: env.NEXTAUTH_SECRET?.trim() || storedSecret(path.join(repoRoot, ".data", "nextauth-secret")),
    ...s3Settings(env, parsePort(env.S3_PORT, "S3_PORT", 4568), path.join(path.dirname(dataDir), `s3-${path.basename(dataDir)}`)),
    // REDIS_URL switches runs and studies to BullMQ; a loopback URL gets Debian's redis-server started.
    redisUrl: env.REDIS_URL?.trim() || null,
    redisPort: env.REDIS_URL?.trim() ? (loopbackPort(env.REDIS_URL.trim()) ?? 6379) : 6379,
    runRedis: !!env.REDIS_URL?.trim() && loopbackPort(env.REDIS_URL.trim()) !== null && env.REDIS_START !== "0",
    redisDir: path.join(path.dirname(dataDir), `redis-${path.basename(dataDir)}`),
  };
}

/** The throwaway test stack (npm test): its own ports from TEST_*, never the demo database. */
export function testStack(env: Env = process.env): Stack {
  const dbPort = parsePort(env.TEST_DB_PORT, "TEST_DB_PORT", 3308);
  const db = { ...dbConfig({ ...env, DB_HOST: "127.0.0.1", DB_PORT: String(dbPort) }) };
  const appPort = parsePort(env.TEST_APP_PORT, "TEST_APP_PORT", 3100);
  const smtpPort = parsePort(env.TEST_SMTP_PORT, "TEST_SMTP_PORT", 2526);
  const mailHttpPort = parsePort(env.TEST_MAIL_HTTP_PORT, "TEST_MAIL_HTTP_PORT", 1081);
  const dataDir = path.join(repoRoot, ".data", `test-${dbPort}`);
  return {
    kind: "test",
    db,
    dataDir,
    appPort,
    appHost: "127.0.0.1",
    appUrl: `http://127.0.0.1:${appPort}`,
    smtpPort,
    mailHttpPort,
    smtpUrl: `smtp://127.0.0.1:${smtpPort}`,
    mailFakeUrl: `http://127.0.0.1:${mailHttpPort}`,
    runMailFake: true,
    mailDir: path.join(repoRoot, ".data", `test-mail-${dbPort}`),
    // A fresh secret per test run: nothing outlives it.
    nextauthSecret: crypto.randomBytes(32).toString("base64url"),
    ...s3Settings({}, parsePort(env.TEST_S3_PORT, "TEST_S3_PORT", 4569), path.join(repoRoot, ".data", `test-s3-${dbPort}`)),
    // Always started for tests: the study tests run one study through the pool and one through BullMQ.
    // Handed over as TEST_REDIS_URL (not REDIS_URL), so every other test keeps the default pool mode.
    redisUrl: `redis://127.0.0.1:${parsePort(env.TEST_REDIS_PORT, "TEST_REDIS_PORT", 6380)}`,
    redisPort: parsePort(env.TEST_REDIS_PORT, "TEST_REDIS_PORT", 6380),
    runRedis: true,
    redisDir: path.join(repoRoot, ".data", `test-redis-${dbPort}`),
  };
}

/** S3 settings: the local fake on loopback unless S3_ENDPOINT names another (then no fake is started). */
function s3Settings(env: Env, port: number, dir: string): Pick<Stack, "s3Port" | "s3Endpoint" | "s3Bucket" | "runS3Fake" | "s3Dir"> {
  const s3Endpoint = env.S3_ENDPOINT?.trim() || `http://127.0.0.1:${port}`;
  return {
    s3Port: port,
    s3Endpoint,
    s3Bucket: env.S3_BUCKET?.trim() || "tautline-files",
    runS3Fake: env.S3_FAKE !== "0" && isLoopbackUrl(s3Endpoint),
    s3Dir: dir,
  };
}

/** A secret generated once and kept in .data/ (mode 600), so sessions survive a restart. */
export function storedSecret(file: string): string {
  try {
    const s = fs.readFileSync(file, "utf8").trim();
    if (s.length >= 32) return s;
  } catch {
    // first run
  }
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const s = crypto.randomBytes(32).toString("base64url");
  fs.writeFileSync(file, s + "\n", { mode: 0o600 });
  return s;
}

/** Environment for Next, vitest and Playwright: the stack's settings over the caller's environment. */
/**
 * The seed runs inside this process and stores the demo park's files through lib/storage, which reads
 * its settings from the environment: point them at this stack's S3 fake first.
 */
export function pointStorageAt(s: Stack): void {
  process.env.S3_ENDPOINT = s.s3Endpoint;
  process.env.S3_BUCKET = s.s3Bucket;
}

export function stackEnv(s: Stack, base: Env = process.env): NodeJS.ProcessEnv {
  const env: Env = {
    ...base,
    DB_HOST: s.db.host,
    DB_PORT: String(s.db.port),
    DB_NAME: s.db.database,
    DB_USER: s.db.user,
    DB_PASSWORD: s.db.password,
    DB_POOL_MAX: String(s.db.poolMax),
    PORT: String(s.appPort),
    NEXTAUTH_URL: s.appUrl,
    NEXTAUTH_SECRET: s.nextauthSecret,
    SMTP_URL: s.smtpUrl,
    MAIL_FAKE_URL: s.mailFakeUrl,
    SMTP_PORT: String(s.smtpPort),
    MAIL_HTTP_PORT: String(s.mailHttpPort),
    S3_ENDPOINT: s.s3Endpoint,
    S3_BUCKET: s.s3Bucket,
    ...(s.kind === "demo" && s.redisUrl ? { REDIS_URL: s.redisUrl } : {}),
    ...(s.kind === "test" && s.redisUrl ? { TEST_REDIS_URL: s.redisUrl, TEST_REDIS_PORT: String(s.redisPort) } : {}),
    ...(s.kind === "test"
      ? {
          TEST_DB_PORT: String(s.db.port),
          TEST_APP_PORT: String(s.appPort),
          TEST_SMTP_PORT: String(s.smtpPort),
          TEST_MAIL_HTTP_PORT: String(s.mailHttpPort),
          TEST_S3_PORT: String(s.s3Port),
          TAUTLINE_TEST: "1",
        }
      : {}),
  };
  return env as NodeJS.ProcessEnv;
}
