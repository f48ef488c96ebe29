/**
 * The local S3-compatible fake (s3rver) for development and tests: loopback only, files in a folder,
 * the bucket created at start. Started by scripts/lib/s3.ts (npm start / dev / test).
 */
import fs from "node:fs";
// s3rver ships no types.
// eslint-disable-next-line @typescript-eslint/no-require-imports
const S3rver = require("s3rver") as new (o: Record<string, unknown>) => { run(): Promise<{ port: number }>; close(): Promise<void> };

export interface S3Fake {
  port: number;
  close(): Promise<void>;
}

export async function startS3Fake(o: { port: number; dir: string; bucket: string }): Promise<S3Fake> {
  fs.mkdirSync(o.dir, { recursive: true });
  const server = new S3rver({
    address: "127.0.0.1",
    port: o.port,
    directory: o.dir,
    silent: true,
    configureBuckets: [{ name: o.bucket }],
  });
  const addr = await server.run();
  return { port: addr.port, close: () => server.close() };
}
