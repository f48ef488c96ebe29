// npm run dev: the S3 fake, the private demo MariaDB (migrated, seeded) and the mail fake, then `next dev`.
import { Lifecycle } from "./lib/lifecycle";
import { bringUpS3Fake } from "./lib/s3";
import { bringUpDatabase, bringUpMailFake, demoSignInHint, nextBin } from "./lib/stack";
import { demoStack, repoRoot, stackEnv } from "./lib/settings";
import { errorMessage, say } from "./lib/log";

async function main(): Promise<number> {
  const life = new Lifecycle();
  life.watchLauncher();
  try {
    const stack = demoStack();
    // The seed stores demo photos and recordings in object storage, so the fake comes first.
    await bringUpS3Fake(stack, life);
    await bringUpDatabase(stack, life);
    await bringUpMailFake(stack, life);
    if (life.interrupted) return 130;
    const next = life.spawn(process.execPath, [nextBin, "dev", "-p", String(stack.appPort), "-H", stack.appHost], {
      cwd: repoRoot,
      env: stackEnv(stack),
    });
    say(`development server at ${stack.appUrl}`);
    say(await demoSignInHint());
    const code = await new Promise<number>((resolve) => next.on("exit", (c) => resolve(c ?? 0)));
    return life.interrupted ? 130 : code;
  } catch (err) {
    console.error(`[tautline] ${errorMessage(err)}`);
    return 1;
  } finally {
    await life.stop();
  }
}

main().then((code) => process.exit(code));
