// npm start: the private demo MariaDB (migrated, seeded), the mail fake, a production build and
// `next start`. Ctrl-C stops Next, the mail fake, then the database, cleanly.
import { Lifecycle } from "./lib/lifecycle";
import { bringUpDatabase, bringUpMailFake, demoSignInHint, hasBuild, nextBin } from "./lib/stack";
import { demoStack, repoRoot, stackEnv } from "./lib/settings";
import { bringUpS3Fake } from "./lib/s3";
import { errorMessage, say, warn } from "./lib/log";

async function main(): Promise<number> {
  const life = new Lifecycle();
  life.watchLauncher();
  try {
    const stack = demoStack();
    const env = stackEnv(stack);
    await bringUpDatabase(stack, life);
    if (life.interrupted) return 130;
    await bringUpMailFake(stack, life);
    await bringUpS3Fake(stack, life);

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
