import { createHash } from "node:crypto";
import { HeadObjectCommand } from "@aws-sdk/client-s3";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { POST as presignRoute } from "@/app/api/inspections/[inspectionId]/photos/route";
import { POST as completeRoute } from "@/app/api/inspections/[inspectionId]/photos/complete/route";
import { DELETE as deleteRoute, GET as viewRoute } from "@/app/api/inspections/[inspectionId]/photos/[photoId]/route";
import { db } from "@/lib/db/knex";
import { submitInspection } from "@/lib/inspections/mutations";
import { PHOTO_MAX_BYTES } from "@/lib/inspections/schemas";
import { bucket, s3 } from "@/lib/storage/s3";
import { draftOn, makeImage } from "../support/inspection-builders";
import { request } from "../support/matrix";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { signInCookie } from "../support/sessions";

/*
 * Photos against the real database and the S3 fake: presigned PUT straight to the
 * store, the server's check on "complete" (size, type by magic bytes, SHA-256,
 * thumbnail), refusals that delete the object, and deletion.
 */

let world: RoleWorld;
let engineerCookie = "";
let unitId = 0;
const engineer = () => ({ id: world.users.engineer.id, name: world.users.engineer.name });

beforeAll(async () => {
  world = await buildRoleWorld(db, "photo");
  engineerCookie = await signInCookie(world.users.engineer.email, WORLD_PASSWORD);
  unitId = (await db("cylinder_units").where({ engine_id: world.engine1 }).orderBy("cylinder_no").first("id")).id;
}, 60_000);

// Route handlers take their segment params as a promise, as Next.js passes them.
const params = (inspectionId: number, photoId?: number) =>
  ({ params: Promise.resolve({ inspectionId: String(inspectionId), ...(photoId ? { photoId: String(photoId) } : {}) }) }) as never;

async function json(res: Response) {
  return { status: res.status, body: await res.json().catch(() => null) };
}

async function exists(key: string): Promise<boolean> {
  try {
    await s3.send(new HeadObjectCommand({ Bucket: bucket, Key: key }));
    return true;
  } catch {
    return false;
  }
}

/** Presign through the route, PUT the bytes the way the browser does, then call complete. */
async function upload(inspectionId: number, bytes: Uint8Array, o: { contentType?: string; fileName?: string; caption?: string | null; stationKey?: string | null; ringPosition?: number | null } = {}) {
  asCaller(engineerCookie);
  const slot = await json(
    await presignRoute(request("POST", `/api/inspections/${inspectionId}/photos`, { fileName: o.fileName ?? "liner.png", contentType: o.contentType ?? "image/png", sizeBytes: bytes.length }), params(inspectionId)),
  );
  expect(slot.status, JSON.stringify(slot.body)).toBe(201);
  const put = await fetch(slot.body.uploadUrl, { method: "PUT", headers: slot.body.headers, body: new Blob([bytes as Uint8Array<ArrayBuffer>]) });
  expect(put.status).toBe(200);
  const key = (await db("stored_files").where({ id: slot.body.fileId }).first("object_key")).object_key as string;
  const done = await json(
    await completeRoute(
      request("POST", `/api/inspections/${inspectionId}/photos/complete`, { fileId: slot.body.fileId, caption: o.caption ?? null, stationKey: o.stationKey ?? null, ringPosition: o.ringPosition ?? null }),
      params(inspectionId),
    ),
  );
  const storedKey = (await db("stored_files").where({ id: slot.body.fileId }).first("object_key")).object_key as string;
  return { ...done, fileId: slot.body.fileId as number, key, storedKey, uploadUrl: slot.body.uploadUrl as string, uploadHeaders: slot.body.headers as Record<string, string> };
}

describe("photos", () => {
  it("stores a photo uploaded through a presigned URL, with its checksum, a thumbnail and an audit entry", async () => {
    const { id } = await draftOn(unitId, engineer(), { complete: false });
    const jpeg = await makeImage("jpeg", 64);
    const res = await upload(id, jpeg, { contentType: "image/jpeg", fileName: "ring1.jpg", caption: "Ring 1 groove", ringPosition: 1 });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ caption: "Ring 1 groove", ringPosition: 1, contentType: "image/jpeg", sizeBytes: jpeg.length, hasThumbnail: true, note: null });
    expect(res.body.sha256).toBe(createHash("sha256").update(jpeg).digest("hex"));
    const files = await db("stored_files").where("object_key", "like", `${res.storedKey}%`).orderBy("id").select("kind", "status", "content_type", "sha256");
    expect(files.map((f) => [f.kind, f.status])).toEqual([
      ["photo", "stored"],
      ["thumbnail", "stored"],
    ]);
    expect(await exists(`${res.storedKey}.thumb.jpg`)).toBe(true);
    // Kept under a key of its own; the key the upload URL was signed for is gone.
    expect(res.storedKey).not.toBe(res.key);
    expect(await exists(res.storedKey)).toBe(true);
    expect(await exists(res.key)).toBe(false);
    const audit = await db("audit_log").where({ entity_type: "inspection", entity_id: String(id), action: "inspection.photo_added" }).first("actor_id", "detail");
    expect(audit.actor_id).toBe(world.users.engineer.id);

    // Reading it back: the route redirects to a short-lived URL that serves the same bytes.
    asCaller(engineerCookie);
    const view = await viewRoute(request("GET", `/api/inspections/${id}/photos/${res.body.id}?variant=full`), params(id, res.body.id));
    expect(view.status).toBe(302);
    const served = Buffer.from(await (await fetch(view.headers.get("location")!)).arrayBuffer());
    expect(createHash("sha256").update(served).digest("hex")).toBe(res.body.sha256);
  });

  it("attaches a photo to a station, and refuses a station the profile lacks", async () => {
    const { id } = await draftOn(unitId, engineer(), { complete: false });
    const ok = await upload(id, await makeImage("png"), { stationKey: "s2" });
    expect(ok.status).toBe(201);
    expect(ok.body.stationKey).toBe("s2");
    const bad = await upload(id, await makeImage("png"), { stationKey: "nope" });
    expect(bad.status).toBe(400);
    expect(bad.body.details.field).toBe("stationKey");
  });

  it("refuses a file that is not an image by its content, whatever its name and type say, and deletes it", async () => {
    const { id } = await draftOn(unitId, engineer(), { complete: false });
    const res = await upload(id, new TextEncoder().encode("station,fa,ath\ns1,600.01,600.00\n"), { contentType: "image/jpeg", fileName: "gauge.jpg" });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatch(/not a JPEG, PNG, WebP or HEIC image/);
    expect(await exists(res.key)).toBe(false);
    expect((await db("stored_files").where({ id: res.fileId }).first("status")).status).toBe("deleted");
    expect(await db("inspection_photos").where({ inspection_id: id }).count({ n: "*" }).first()).toMatchObject({ n: 0 });
  });

  it("refuses an oversize photo up front, and deletes one that turns out oversize after upload", async () => {
    const { id } = await draftOn(unitId, engineer(), { complete: false });
    asCaller(engineerCookie);
    const declared = await json(
      await presignRoute(request("POST", `/api/inspections/${id}/photos`, { fileName: "big.jpg", contentType: "image/jpeg", sizeBytes: PHOTO_MAX_BYTES + 1 }), params(id)),
    );
    expect(declared.status).toBe(400);
    expect(declared.body.error).toMatch(/the limit is 15.0 MB/);

    // A client that claims a small file but sends a large one: the store refuses a length other than the one signed…
    asCaller(engineerCookie);
    const slot = await json(await presignRoute(request("POST", `/api/inspections/${id}/photos`, { fileName: "big.jpg", contentType: "image/jpeg", sizeBytes: 1000 }), params(id)));
    const big = new Uint8Array(PHOTO_MAX_BYTES + 1024);
    big.set([0xff, 0xd8, 0xff, 0xe0]);
    expect((await fetch(slot.body.uploadUrl, { method: "PUT", headers: slot.body.headers, body: new Blob([big]) })).status).toBe(403);
    // …and should a store let it through anyway, the server measures the object itself.
    const { PutObjectCommand } = await import("@aws-sdk/client-s3");
    const pendingKey = (await db("stored_files").where({ id: slot.body.fileId }).first("object_key")).object_key;
    await s3.send(new PutObjectCommand({ Bucket: bucket, Key: pendingKey, Body: big, ContentType: "image/jpeg" }));
    const key = (await db("stored_files").where({ id: slot.body.fileId }).first("object_key")).object_key;
    const done = await json(await completeRoute(request("POST", `/api/inspections/${id}/photos/complete`, { fileId: slot.body.fileId, caption: null, stationKey: null, ringPosition: null }), params(id)));
    expect(done.status).toBe(400);
    expect(done.body.error).toMatch(/15.0 MB/);
    expect(await exists(key)).toBe(false);
  });

  it("keeps a HEIC photo without a thumbnail when none can be made, and says so", async () => {
    const { id } = await draftOn(unitId, engineer(), { complete: false });
    // An ISO-BMFF header with the "heic" brand: enough for the content check; no decoder can preview it.
    const heic = new Uint8Array(2048);
    heic.set([0x00, 0x00, 0x00, 0x18, ...new TextEncoder().encode("ftypheic"), 0, 0, 0, 0, ...new TextEncoder().encode("mif1heic")]);
    const res = await upload(id, heic, { contentType: "image/heic", fileName: "IMG_0001.HEIC" });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ contentType: "image/heic", hasThumbnail: false });
    expect(res.body.note).toMatch(/No preview/);
  });

  it("deletes a photo and its objects; refuses photos on a record that is no longer a draft", async () => {
    const d = await draftOn(unitId, engineer());
    const res = await upload(d.id, await makeImage("png"));
    expect(res.status).toBe(201);
    asCaller(engineerCookie);
    const del = await json(await deleteRoute(request("DELETE", `/api/inspections/${d.id}/photos/${res.body.id}`), params(d.id, res.body.id)));
    expect(del).toMatchObject({ status: 200, body: { deletedObjects: 2 } });
    expect(await exists(res.storedKey)).toBe(false);
    expect(await exists(`${res.storedKey}.thumb.jpg`)).toBe(false);
    expect((await db("stored_files").where({ id: res.fileId }).first("status")).status).toBe("deleted");

    await submitInspection(engineer(), d.id, undefined);
    asCaller(engineerCookie);
    const late = await json(await presignRoute(request("POST", `/api/inspections/${d.id}/photos`, { fileName: "a.png", contentType: "image/png", sizeBytes: 100 }), params(d.id)));
    expect(late.status).toBe(409);
    expect(late.body.error).toMatch(/only while it is a draft/);
  });

  it("keeps the completed photo as it was checked: its upload URL can no longer replace it", async () => {
    const { id } = await draftOn(unitId, engineer(), { complete: false });
    const png = await makeImage("png", 48);
    const res = await upload(id, png, { contentType: "image/png", fileName: "liner.png" });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    // The same URL, inside its few minutes, with bytes of the same length and type.
    const forged = new Uint8Array(png.length).fill(0x41);
    const again = await fetch(res.uploadUrl, { method: "PUT", headers: res.uploadHeaders, body: new Blob([forged]) });
    expect([200, 403]).toContain(again.status);
    asCaller(engineerCookie);
    const view = await viewRoute(request("GET", `/api/inspections/${id}/photos/${res.body.id}?variant=full`), params(id, res.body.id));
    const served = Buffer.from(await (await fetch(view.headers.get("location")!)).arrayBuffer());
    expect(createHash("sha256").update(served).digest("hex")).toBe(res.body.sha256);
    expect(createHash("sha256").update(served).digest("hex")).toBe(createHash("sha256").update(png).digest("hex"));
  });

  it("signs the upload for the declared length and type, for a few minutes only", async () => {
    const { id } = await draftOn(unitId, engineer(), { complete: false });
    const png = await makeImage("png", 32);
    asCaller(engineerCookie);
    const slot = await json(await presignRoute(request("POST", `/api/inspections/${id}/photos`, { fileName: "a.png", contentType: "image/png", sizeBytes: png.length }), params(id)));
    expect(slot.status).toBe(201);
    const url = new URL(slot.body.uploadUrl);
    expect(Number(url.searchParams.get("X-Amz-Expires"))).toBeLessThanOrEqual(300);
    expect(url.searchParams.get("X-Amz-SignedHeaders")?.split(";")).toEqual(expect.arrayContaining(["content-length", "content-type", "host"]));
    const longer = new Uint8Array(png.length + 1);
    longer.set(png);
    expect((await fetch(slot.body.uploadUrl, { method: "PUT", headers: slot.body.headers, body: new Blob([longer]) })).status).toBe(403);
    expect((await fetch(slot.body.uploadUrl, { method: "PUT", headers: { "Content-Type": "text/html" }, body: new Blob([png as Uint8Array<ArrayBuffer>]) })).status).toBe(403);
    expect((await fetch(slot.body.uploadUrl, { method: "PUT", headers: slot.body.headers, body: new Blob([png as Uint8Array<ArrayBuffer>]) })).status).toBe(200);
  });

  it("serves a photo with the type found by its content and a disposition of its own, never the uploader's name or claim", async () => {
    const { id } = await draftOn(unitId, engineer(), { complete: false });
    // Declared as an unknown type with an HTML name; the content is a PNG.
    const res = await upload(id, await makeImage("png", 40), { contentType: "application/octet-stream", fileName: "evidence.html" });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    asCaller(engineerCookie);
    const view = await viewRoute(request("GET", `/api/inspections/${id}/photos/${res.body.id}?variant=full`), params(id, res.body.id));
    const served = await fetch(view.headers.get("location")!);
    expect(served.headers.get("content-type")).toBe("image/png");
    expect(served.headers.get("content-disposition")).toBe(`inline; filename="photo-${res.body.id}.png"`);
    const thumb = await viewRoute(request("GET", `/api/inspections/${id}/photos/${res.body.id}?variant=thumb`), params(id, res.body.id));
    expect((await fetch(thumb.headers.get("location")!)).headers.get("content-type")).toBe("image/jpeg");
  });

  it("refuses a file type that is not a photo before any upload", async () => {
    const { id } = await draftOn(unitId, engineer(), { complete: false });
    asCaller(engineerCookie);
    const res = await json(await presignRoute(request("POST", `/api/inspections/${id}/photos`, { fileName: "report.pdf", contentType: "application/pdf", sizeBytes: 5000 }), params(id)));
    expect(res.status).toBe(400);
    expect(res.body.details.field).toBe("contentType");
  });
});

describe("abandoned uploads", () => {
  it("removes a slot left pending for over a day, object and all, and keeps a fresh one", async () => {
    const { PutObjectCommand } = await import("@aws-sdk/client-s3");
    const { purgeAbandonedUploads } = await import("@/lib/photos/mutations");
    const oldKey = `inspections/abandoned/${Date.now()}-old`;
    const newKey = `inspections/abandoned/${Date.now()}-new`;
    for (const key of [oldKey, newKey]) await s3.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: "x", ContentType: "image/png" }));
    const [oldId] = await db("stored_files").insert({ object_key: oldKey, kind: "photo", content_type: "image/png", size_bytes: 1, status: "pending", created_at: new Date(Date.now() - 25 * 3_600_000) });
    const [newId] = await db("stored_files").insert({ object_key: newKey, kind: "photo", content_type: "image/png", size_bytes: 1, status: "pending" });
    expect(await purgeAbandonedUploads(db)).toBeGreaterThanOrEqual(1);
    expect(await db("stored_files").where({ id: oldId }).first("status")).toEqual({ status: "deleted" });
    expect(await exists(oldKey)).toBe(false);
    expect(await db("stored_files").where({ id: newId }).first("status")).toEqual({ status: "pending" });
    expect(await exists(newKey)).toBe(true);
  });
});
