import "server-only";
import { S3Client, HeadBucketCommand, CreateBucketCommand } from "@aws-sdk/client-s3";
import { serverEnv } from "@/lib/env";

const globalForS3 = globalThis as unknown as { kaliboreS3?: S3Client };

/**
 * One S3 client for the local fake and for real S3/MinIO alike. The two checksum
 * settings keep streamed uploads intact on S3-compatible servers that do not speak
 * the newer flexible-checksum protocol.
 */
export const s3: S3Client =
  globalForS3.kaliboreS3 ??
  new S3Client({
    endpoint: serverEnv.S3_ENDPOINT,
    region: serverEnv.S3_REGION,
    forcePathStyle: serverEnv.S3_FORCE_PATH_STYLE,
    credentials: { accessKeyId: serverEnv.S3_ACCESS_KEY_ID, secretAccessKey: serverEnv.S3_SECRET_ACCESS_KEY },
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
globalForS3.kaliboreS3 = s3;

export const bucket = serverEnv.S3_BUCKET;

/** Resolves when the bucket answers; throws with the store's own message otherwise. */
export async function checkBucket(): Promise<void> {
  await s3.send(new HeadBucketCommand({ Bucket: bucket }));
}

/** Creates the bucket if it is missing (first start against an empty store). */
export async function ensureBucket(): Promise<void> {
  try {
    await checkBucket();
  } catch {
    await s3.send(new CreateBucketCommand({ Bucket: bucket }));
  }
}
