import "server-only";
import { DeleteObjectCommand, GetObjectCommand, HeadObjectCommand, PutObjectCommand } from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { bucket, s3 } from "@/lib/storage/s3";

/*
 * The object-store side of photos. Browsers upload straight to the store with a
 * presigned PUT (the app server never carries the bytes in), and read through short-lived
 * presigned GETs; the server reads an object back once, to check it.
 */

/**
 * A presigned upload is for one photo, sent now: it expires in minutes (the clock stops
 * when the upload starts, so a slow link still finishes), and the store refuses a body of
 * another length or type, since both are part of the signature.
 */
export const UPLOAD_TTL_S = 5 * 60;
const READ_TTL_S = 5 * 60;

/** A URL the browser can PUT one object of exactly `sizeBytes` and `contentType` to, and the headers it must send. */
export async function presignUpload(key: string, contentType: string, sizeBytes: number): Promise<{ url: string; headers: Record<string, string> }> {
  const url = await getSignedUrl(s3, new PutObjectCommand({ Bucket: bucket, Key: key, ContentType: contentType, ContentLength: sizeBytes }), {
    expiresIn: UPLOAD_TTL_S,
    signableHeaders: new Set(["content-type", "content-length"]),
  });
  // The browser sets Content-Length itself from the file; it must equal the size declared.
  return { url, headers: { "Content-Type": contentType } };
}

const EXTENSIONS: Record<string, string> = { "image/jpeg": "jpg", "image/png": "png", "image/webp": "webp", "image/heic": "heic", "image/heif": "heif" };

/**
 * A short-lived read URL for a stored photo. The answer carries the type found by content
 * when the photo was checked, and a file name of our own with that type's extension; a
 * type that is not one of the checked image types is only ever offered as a download, so
 * nothing from the store can be rendered as a page.
 */
export async function presignRead(key: string, checkedType: string, name = "photo"): Promise<string> {
  const ext = EXTENSIONS[checkedType];
  const safeName = name.replace(/[^\w.-]/g, "_").slice(0, 60) || "photo";
  return getSignedUrl(
    s3,
    new GetObjectCommand({
      Bucket: bucket,
      Key: key,
      ResponseContentType: ext ? checkedType : "application/octet-stream",
      ResponseContentDisposition: ext ? `inline; filename="${safeName}.${ext}"` : `attachment; filename="${safeName}"`,
      ResponseCacheControl: "private, max-age=300",
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
