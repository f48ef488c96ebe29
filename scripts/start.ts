// npm start: the private demo MariaDB (migrated, seeded), the mail fake, a production build and
// `next start`. Ctrl-C stops Next, the mail fake, then the database, cleanly.
import { Lifecycle } from "./lib/lifecycle";
import { bringUpDatabase, bringUpMailFake, demoSignInHint, hasBuild, nextBin } from "./lib/stack";
import { demoStack, repoRoot, stackEnv } from "./lib/settings";
import { bringUpS3Fake } from "./lib/s3";
import { bringUpRedis } from "./lib/redis";
import { errorMessage, say, warn } from "./lib/log";
import path from "node:path";

const tsxCli = path.join(repoRoot, "node_modules", "tsx", "dist", "cli.mjs");

async function main(): Promise<number> {
  const life = new Lifecycle();
  life.watchLauncher();
  try {
    const stack = demoStack();
    const env = stackEnv(stack);
    // Object storage first: the seed steps store the demo park's files.
    await bringUpS3Fake(stack, life);
    await bringUpDatabase(stack, life);
    if (life.interrupted) return 130;
    await bringUpMailFake(stack, life);
    if (stack.redisUrl) {
      // Queue mode: Redis on loopback (unless REDIS_URL names another host) and one local worker process.
      if (stack.runRedis) await bringUpRedis(stack.redisPort, stack.redisDir, life);
      else say(`REDIS_URL points at ${stack.redisUrl}: not starting redis-server`);
    }

    const skip = process.env.TAUTLINE_SKIP_BUILD === "1";
    if (skip && hasBuild()) {
      say("TAUTLINE_SKIP_BUILD=1: using the existing build in .next/");
    } else {
      if (skip) warn("TAUTLINE_SKIP_BUILD=1 but there is no build in .next/ yet: building");
      say("next build");
      const code = await life.run(process.execPath, [nextBin, "build"], { cwd: repoRoot, env });
      if (code !== 0) throw new Error(`next build failed (exit ${code})`);
    }
    if (life.interrupted) return 130;

    const next = life.spawn(process.execPath, [nextBin, "start", "-p", String(stack.appPort), "-H", stack.appHost], {
      cwd: repoRoot,
      env: { ...env, NODE_ENV: "production" },
    });
    if (stack.redisUrl && process.env.JOB_LOCAL_WORKER !== "0") {
      life.spawn(process.execPath, [tsxCli, path.join(repoRoot, "scripts", "worker.ts")], { cwd: repoRoot, env: { ...env, NODE_ENV: "production" } });
      say("queue mode: runs go through BullMQ; one local worker started (start more with npm run worker)");
    }
    say(`Tautline is starting at ${stack.appUrl}`);
    say(await demoSignInHint());
    say("Press Ctrl-C to stop (the database shuts down cleanly).");
    const code = await new Promise<number>((resolve) => next.on("exit", (c) => resolve(c ?? 0)));
    if (!life.interrupted) warn(`next start exited (code ${code})`);
    return life.interrupted ? 130 : code;
  } catch (err) {
    console.error(`[tautline] ${errorMessage(err)}`);
    return 1;
  } finally {
    await life.stop();
  }
}

main().then((code) => process.exit(code));
