import "server-only";
import { DeleteObjectCommand, GetObjectCommand, HeadObjectCommand, PutObjectCommand } from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { bucket, s3 } from "@/lib/storage/s3";

/*
 * The object-store side of photos. Browsers upload straight to the store with a
 * presigned PUT (the app server never carries the bytes in), and read through short-lived
 * presigned GETs; the server reads an object back once, to check it.
 */

const UPLOAD_TTL_S = 15 * 60;
const READ_TTL_S = 5 * 60;

/** A URL the browser can PUT one object to, and the headers it must send with it. */
export async function presignUpload(key: string, contentType: string): Promise<{ url: string; headers: Record<string, string> }> {
  const url = await getSignedUrl(s3, new PutObjectCommand({ Bucket: bucket, Key: key, ContentType: contentType }), { expiresIn: UPLOAD_TTL_S });
  return { url, headers: { "Content-Type": contentType } };
}

export async function presignRead(key: string, contentType: string, fileName?: string | null): Promise<string> {
  return getSignedUrl(
    s3,
    new GetObjectCommand({
      Bucket: bucket,
      Key: key,
      ResponseContentType: contentType,
      ResponseContentDisposition: fileName ? `inline; filename="${fileName.replace(/[^\w.\- ]/g, "_")}"` : undefined,
    }),
    { expiresIn: READ_TTL_S },
  );
}

/** Size of an object, or null when it is not there. */
export async function objectSize(key: string): Promise<number | null> {
  try {
    const head = await s3.send(new HeadObjectCommand({ Bucket: bucket, Key: key }));
    return Number(head.ContentLength ?? 0);
  } catch (err) {
    const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
    if (e?.name === "NotFound" || e?.$metadata?.httpStatusCode === 404) return null;
    throw err;
  }
}

export async function readObject(key: string): Promise<Buffer> {
  const res = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
  const bytes = await res.Body!.transformToByteArray();
  return Buffer.from(bytes);
}

export async function writeObject(key: string, body: Buffer, contentType: string): Promise<void> {
  await s3.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: body, ContentType: contentType, ContentLength: body.length }));
}

/** Deletes an object; a missing object is not an error (deleting twice is fine). */
export async function removeObject(key: string): Promise<void> {
  await s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
}
