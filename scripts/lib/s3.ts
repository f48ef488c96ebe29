import { startS3Fake, type S3Fake } from "../../lib/storage/fake-server";
import type { Lifecycle } from "./lifecycle";
import { say } from "./log";
import type { Stack } from "./settings";

/** Starts the local S3 fake on loopback (unless S3_ENDPOINT points at a real store) and stops it on exit. */
export async function bringUpS3Fake(stack: Stack, life: Lifecycle): Promise<S3Fake | null> {
  if (!stack.runS3Fake) {
    say(`S3_ENDPOINT points at ${stack.s3Endpoint}: not starting the local S3 fake`);
    return null;
  }
  const fake = await startS3Fake({ port: stack.s3Port, dir: stack.s3Dir, bucket: stack.s3Bucket });
  say(`S3 fake: ${stack.s3Endpoint} (bucket ${stack.s3Bucket}, files in ${stack.s3Dir})`);
  life.onStop("S3 fake", async () => {
    say("stopping the S3 fake");
    await fake.close();
  });
  return fake;
}
