/**
 * Object storage settings (S3 API). Locally the start and test commands run the S3-compatible fake on
 * loopback; in production S3_ENDPOINT (or no endpoint: AWS itself), S3_BUCKET and the keys point at a real
 * store. The bucket is private: files are only ever served through our API after the permission checks.
 */
export interface StorageConfig {
  endpoint: string | undefined;
  bucket: string;
  region: string;
  accessKeyId: string;
  secretAccessKey: string;
  /** Path-style URLs (bucket in the path): needed by the local fake and most S3-compatible stores. */
  forcePathStyle: boolean;
}

/** The fake's fixed development credentials (it accepts these only; never used against a real store). */
export const FAKE_ACCESS_KEY = "S3RVER";
export const FAKE_SECRET_KEY = "S3RVER";
export const DEFAULT_BUCKET = "tautline-files";

export function storageConfig(env: Readonly<Record<string, string | undefined>> = process.env): StorageConfig {
  const endpoint = env.S3_ENDPOINT?.trim() || (env.NODE_ENV === "production" && !env.TAUTLINE_TEST ? undefined : "http://127.0.0.1:4568");
  return {
    endpoint,
    bucket: env.S3_BUCKET?.trim() || DEFAULT_BUCKET,
    region: env.S3_REGION?.trim() || "us-east-1",
    accessKeyId: env.S3_ACCESS_KEY?.trim() || FAKE_ACCESS_KEY,
    secretAccessKey: env.S3_SECRET_KEY?.trim() || FAKE_SECRET_KEY,
    forcePathStyle: env.S3_PATH_STYLE ? env.S3_PATH_STYLE !== "0" : endpoint !== undefined,
  };
}
