import "server-only";
import { GetObjectCommand } from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { bucket, s3 } from "@/lib/storage/s3";

/**
 * A short-lived link to download an imported file again, byte for byte as it was imported (its
 * SHA-256 is on the import). Always an attachment of type text/csv with a file name of our own,
 * so a browser never renders it and a name from the uploader never reaches a header.
 */
export async function presignImportDownload(key: string, importId: number): Promise<string> {
  return getSignedUrl(
    s3,
    new GetObjectCommand({
      Bucket: bucket,
      Key: key,
      ResponseContentType: "text/csv; charset=utf-8",
      ResponseContentDisposition: `attachment; filename="kalibore-import-${importId}.csv"`,
      ResponseCacheControl: "private, no-store",
    }),
    { expiresIn: 120 },
  );
}
