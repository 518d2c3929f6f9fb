import { GetObjectCommand, PutObjectCommand } from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { beforeAll, describe, expect, it } from "vitest";
import { bucket, s3 } from "@/lib/storage/s3";
import { serverEnv } from "@/lib/env";

/*
 * The bundled S3 fake (scripts/fakes.ts) behaves as a private bucket: unsigned requests
 * are refused (s3rver alone lets anyone list and read), version-4 signatures are checked,
 * presigned URLs expire, and CORS answers only the app's origin, by name.
 */

const endpoint = serverEnv.S3_ENDPOINT;
const key = `inspections/fake-check/${crypto.randomUUID()}`;
const appOrigin = new URL(process.env.APP_URL ?? "http://localhost:3000").origin;

beforeAll(async () => {
  await s3.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: "evidence", ContentType: "image/png" }));
});

describe("the S3 fake is a private bucket", () => {
  it("refuses anonymous list and read", async () => {
    expect((await fetch(`${endpoint}/${bucket}`)).status).toBe(403);
    expect((await fetch(`${endpoint}/${bucket}?list-type=2`)).status).toBe(403);
    expect((await fetch(`${endpoint}/${bucket}/${key}`)).status).toBe(403);
    expect((await fetch(`${endpoint}/`)).status).toBe(403);
  });

  it("serves a presigned read, and refuses it with the signature altered or expired", async () => {
    const url = await getSignedUrl(s3, new GetObjectCommand({ Bucket: bucket, Key: key }), { expiresIn: 60 });
    const ok = await fetch(url);
    expect(ok.status).toBe(200);
    expect(await ok.text()).toBe("evidence");
    const u = new URL(url);
    const sig = u.searchParams.get("X-Amz-Signature")!;
    u.searchParams.set("X-Amz-Signature", (sig[0] === "0" ? "1" : "0") + sig.slice(1));
    expect((await fetch(u)).status).toBe(403);
    // Another object with the same signature.
    expect((await fetch(url.replace(key, `${key}x`))).status).toBe(403);
    const expired = await getSignedUrl(s3, new GetObjectCommand({ Bucket: bucket, Key: key }), { expiresIn: 1, signingDate: new Date(Date.now() - 120_000) });
    expect((await fetch(expired)).status).toBe(403);
  });

  it("answers CORS for the app's origin by name, and not for another origin", async () => {
    const preflight = (origin: string) =>
      fetch(`${endpoint}/${bucket}/${key}`, { method: "OPTIONS", headers: { origin, "access-control-request-method": "PUT", "access-control-request-headers": "content-type" } });
    const mine = await preflight(appOrigin);
    expect(mine.status).toBe(200);
    expect(mine.headers.get("access-control-allow-origin")).toBe(appOrigin);
    const other = await preflight("http://evil.example");
    expect(other.status).toBe(403);
    expect(other.headers.get("access-control-allow-origin")).toBeNull();
  });
});
