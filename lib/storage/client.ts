import crypto from "node:crypto";
import { GetObjectCommand, PutObjectCommand, DeleteObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { unavailable } from "@/lib/http/errors";
import { storageConfig, type StorageConfig } from "./config";

// The SDK warns on Node 20 that releases after January 2027 will need Node 22. The project pins its SDK
// version (package.json) and runs on Node 20, so the notice is noise in every log; silence it once.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= "true";

const globalForS3 = globalThis as unknown as { tautlineS3?: { key: string; client: S3Client; config: StorageConfig } };

function s3(): { client: S3Client; config: StorageConfig } {
  const config = storageConfig();
  const key = JSON.stringify(config);
  if (globalForS3.tautlineS3?.key !== key) {
    globalForS3.tautlineS3 = {
      key,
      config,
      client: new S3Client({
        endpoint: config.endpoint,
        region: config.region,
        forcePathStyle: config.forcePathStyle,
        credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
        // The fake and most stores answer quickly; don't hang a request on a store that is away.
        requestHandler: { connectionTimeout: 3_000, requestTimeout: 15_000 },
        maxAttempts: 2,
      }),
    };
  }
  return globalForS3.tautlineS3;
}

/** A generated object key: never derived from the uploaded file's name. */
export function newStorageKey(prefix: "photos" | "recordings", organisationId: number): string {
  return `${prefix}/${organisationId}/${crypto.randomUUID()}`;
}

function storageError(err: unknown): Error {
  const where = storageConfig().endpoint ?? "the S3 store";
  return unavailable(`Object storage at ${where} did not answer (${(err as Error).name}: ${(err as Error).message}).`);
}

export async function putObject(key: string, body: Buffer, contentType: string): Promise<void> {
  const { client, config } = s3();
  try {
    await client.send(new PutObjectCommand({ Bucket: config.bucket, Key: key, Body: body, ContentType: contentType }));
  } catch (err) {
    throw storageError(err);
  }
}

export async function getObject(key: string): Promise<Buffer> {
  const { client, config } = s3();
  try {
    const r = await client.send(new GetObjectCommand({ Bucket: config.bucket, Key: key }));
    const bytes = await r.Body!.transformToByteArray();
    return Buffer.from(bytes);
  } catch (err) {
    throw storageError(err);
  }
}

export async function deleteObject(key: string): Promise<void> {
  const { client, config } = s3();
  try {
    await client.send(new DeleteObjectCommand({ Bucket: config.bucket, Key: key }));
  } catch (err) {
    throw storageError(err);
  }
}
