import "server-only";
import { createHash, randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { writeAudit } from "@/lib/audit/mutations";
import { RecordError } from "@/lib/inspections/errors";
import { db as defaultDb } from "@/lib/db/knex";
import { lockEditableInspection } from "@/lib/inspections/mutations";
import { getPendingFile, getPhotoObjects, listPhotos } from "@/lib/inspections/photo-queries";
import { PHOTO_MAX_BYTES, PHOTO_TYPES, type PhotoDto } from "@/lib/inspections/schemas";
import { sniffImageType } from "./sniff";
import { objectSize, presignUpload, readObject, removeObject, writeObject } from "./storage";
import { inTransaction } from "@/lib/db/transaction";

/*
 * Photos in three steps: a slot (a pending ledger row and a presigned PUT), the upload
 * from the browser straight to the store, and "complete", where the server reads the
 * object back and keeps it only if it is an image by content and within the size limit.
 * A refused upload is deleted from the store at once. A kept photo is written, from the
 * very bytes that were checked and hashed, to a new key no upload URL was ever signed for,
 * and the upload key is deleted: once completed, the evidence cannot be replaced.
 */

type Actor = { id: string; name: string };

const mb = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
const THUMB_MAX_PX = 480;

export type PhotoSlot = { fileId: number; uploadUrl: string; headers: Record<string, string> };

/** Reserves an object key for one photo of a draft and returns where to PUT it. */
export async function createPhotoSlot(
  actor: Actor,
  inspectionId: number,
  input: { fileName: string; contentType: string; sizeBytes: number },
  db: Knex = defaultDb,
): Promise<PhotoSlot> {
  if (input.sizeBytes > PHOTO_MAX_BYTES) {
    throw new RecordError(400, `The photo is ${mb(input.sizeBytes)}; the limit is ${mb(PHOTO_MAX_BYTES)}. (field: sizeBytes)`, { field: "sizeBytes" });
  }
  // Some browsers send no type for HEIC; the content is checked after upload either way.
  const declared = input.contentType.toLowerCase();
  const contentType = (PHOTO_TYPES as readonly string[]).includes(declared) ? declared : declared === "" || declared === "application/octet-stream" ? "application/octet-stream" : null;
  if (!contentType) {
    throw new RecordError(400, `A ${input.contentType || "file of unknown type"} is not a photo: use JPEG, PNG, WebP or HEIC. (field: contentType)`, { field: "contentType" });
  }
  const { fileId, key } = await inTransaction(db, async (trx) => {
    const row = await lockEditableInspection(trx, inspectionId);
    const key = `inspections/${inspectionId}/${randomUUID()}`;
    const [fileId] = await trx("stored_files").insert({
      object_key: key,
      kind: "photo",
      content_type: contentType,
      size_bytes: input.sizeBytes,
      original_name: input.fileName.slice(0, 255),
      status: "pending",
      vessel_id: row.vesselId,
      uploaded_by: actor.id,
    });
    return { fileId: fileId as number, key };
  });
  const { url, headers } = await presignUpload(key, contentType, input.sizeBytes);
  // Housekeeping that must never block a new photo.
  void purgeAbandonedUploads(db).catch((err) => console.error("purging abandoned uploads failed", err));
  return { fileId, uploadUrl: url, headers };
}

async function discard(db: Knex, fileId: number, key: string) {
  await removeObject(key).catch(() => undefined);
  await db("stored_files").where({ id: fileId }).update({ status: "deleted" });
}

async function makeThumbnail(bytes: Buffer): Promise<Buffer | null> {
  try {
    const sharp = (await import("sharp")).default;
    return await sharp(bytes).rotate().resize(THUMB_MAX_PX, THUMB_MAX_PX, { fit: "inside", withoutEnlargement: true }).jpeg({ quality: 72 }).toBuffer();
  } catch {
    // HEIC needs a decoder the prebuilt image library may not have: keep the photo without a preview.
    return null;
  }
}

export type CompletedPhoto = PhotoDto & { note: string | null };

/**
 * Checks an uploaded object and files it: size, type by content (magic bytes), SHA-256,
 * a thumbnail where the format allows, then the ledger rows and the audit entry in one
 * transaction. Oversize or non-image uploads are deleted and refused with a reason.
 */
export async function completePhoto(
  actor: Actor,
  inspectionId: number,
  input: { fileId: number; caption: string | null; stationKey: string | null; ringPosition: number | null },
  db: Knex = defaultDb,
): Promise<CompletedPhoto> {
  const file = await getPendingFile(input.fileId, db);
  if (!file || file.kind !== "photo" || !file.object_key.startsWith(`inspections/${inspectionId}/`)) {
    throw new RecordError(404, "No such upload for this inspection. (field: fileId)", { field: "fileId" });
  }
  if (file.status === "stored") throw new RecordError(409, "This upload was already completed.");
  if (file.status !== "pending") throw new RecordError(409, "This upload was refused or removed; upload the photo again.");
  if (file.uploaded_by !== actor.id) throw new RecordError(403, "Only the person who started this upload can complete it.");

  // Where the photo belongs must exist in this inspection's engine profile.
  const target = await db("inspections as i")
    .join("cylinder_units as u", "u.id", "i.unit_id")
    .join("main_engines as e", "e.id", "u.engine_id")
    .where("i.id", inspectionId)
    .first("e.profile_id");
  let stationId: number | null = null;
  if (input.stationKey) {
    const s = await db("profile_stations").where({ profile_id: target.profile_id, station_key: input.stationKey }).first("id");
    if (!s) throw new RecordError(400, `Station "${input.stationKey}" is not in this engine's profile. (field: stationKey)`, { field: "stationKey" });
    stationId = s.id;
  }
  if (input.ringPosition != null) {
    const r = await db("profile_rings").where({ profile_id: target.profile_id, position: input.ringPosition }).first("id");
    if (!r) throw new RecordError(400, `Ring ${input.ringPosition} is not in this engine's profile. (field: ringPosition)`, { field: "ringPosition" });
  }

  const size = await objectSize(file.object_key);
  if (size === null) throw new RecordError(400, "The photo did not arrive in the store. Upload it again. (field: fileId)", { field: "fileId" });
  if (size > PHOTO_MAX_BYTES) {
    await discard(db, file.id, file.object_key);
    throw new RecordError(400, `The photo is ${mb(size)}; the limit is ${mb(PHOTO_MAX_BYTES)}. It was not kept. (field: file)`, { field: "file" });
  }
  if (size === 0) {
    await discard(db, file.id, file.object_key);
    throw new RecordError(400, "The uploaded file is empty. It was not kept. (field: file)", { field: "file" });
  }
  const bytes = await readObject(file.object_key);
  const type = sniffImageType(bytes);
  if (!type) {
    await discard(db, file.id, file.object_key);
    throw new RecordError(400, "This file is not a JPEG, PNG, WebP or HEIC image (judged by its content, not its name). It was not kept. (field: file)", {
      field: "file",
    });
  }
  const sha256 = createHash("sha256").update(bytes).digest("hex");
  // The stored copy: the checked bytes under a fresh, unguessable key with its checked type.
  const storedKey = `inspections/${inspectionId}/photo-${randomUUID()}`;
  await writeObject(storedKey, bytes, type);
  const thumb = await makeThumbnail(bytes);
  const thumbKey = `${storedKey}.thumb.jpg`;
  if (thumb) await writeObject(thumbKey, thumb, "image/jpeg");
  const note = thumb ? null : `No preview could be made for this ${type === "image/jpeg" || type === "image/png" || type === "image/webp" ? "image" : "HEIC/HEIF"} photo; the original is kept.`;

  let photoId: number;
  try {
    photoId = await inTransaction(db, async (trx) => {
      const row = await lockEditableInspection(trx, inspectionId);
      const claimed = await trx("stored_files")
        .where({ id: file.id, status: "pending" })
        .update({ status: "stored", object_key: storedKey, content_type: type, size_bytes: size, sha256 });
      if (claimed !== 1) throw new RecordError(409, "This upload was already completed.");
      let thumbId: number | null = null;
      if (thumb) {
        [thumbId] = await trx("stored_files").insert({
          object_key: thumbKey,
          kind: "thumbnail",
          content_type: "image/jpeg",
          size_bytes: thumb.length,
          sha256: createHash("sha256").update(thumb).digest("hex"),
          status: "stored",
          vessel_id: row.vesselId,
          uploaded_by: actor.id,
        });
      }
      const [pid] = await trx("inspection_photos").insert({
        inspection_id: inspectionId,
        file_id: file.id,
        thumbnail_file_id: thumbId,
        station_id: stationId,
        ring_position: input.ringPosition,
        caption: input.caption,
      });
      await writeAudit(
        {
          actor,
          action: "inspection.photo_added",
          entityType: "inspection",
          entityId: inspectionId,
          vesselId: row.vesselId,
          detail: { photoId: pid, caption: input.caption, stationKey: input.stationKey, ringPosition: input.ringPosition, contentType: type, sizeBytes: size, sha256, thumbnail: !!thumb },
        },
        trx,
      );
      return pid as number;
    });
  } catch (err) {
    // The inspection left draft meanwhile (or the upload was completed twice): keep nothing half-filed.
    await removeObject(storedKey).catch(() => undefined);
    if (thumb) await removeObject(thumbKey).catch(() => undefined);
    if (err instanceof RecordError && err.status === 409 && err.message !== "This upload was already completed.") {
      await discard(db, file.id, file.object_key);
    }
    throw err;
  }
  // The upload key's object is no longer the record's; an upload URL still inside its few
  // minutes can only write there, never over the stored photo.
  await removeObject(file.object_key).catch((err) => console.error("removing a completed upload failed", err));
  const dto = (await listPhotos(inspectionId, db)).find((p) => p.id === photoId)!;
  return { ...dto, note };
}

/**
 * Removes a photo from a draft. The stored objects are deleted when no other version of
 * the record (an amendment shares its original's photos) still refers to them.
 */
export async function deletePhoto(actor: Actor, inspectionId: number, photoId: number, db: Knex = defaultDb): Promise<{ deletedObjects: number }> {
  const keys = await inTransaction(db, async (trx) => {
    const row = await lockEditableInspection(trx, inspectionId);
    const photo = await getPhotoObjects(inspectionId, photoId, trx);
    if (!photo) throw new RecordError(404, "Photo not found.");
    await trx("inspection_photos").where({ id: photoId }).delete();
    const stillUsed = await trx("inspection_photos").where({ file_id: photo.fileId }).first("id");
    const keys: string[] = [];
    if (!stillUsed) {
      const ids = [photo.fileId, photo.thumbnailFileId].filter((v): v is number => v !== null);
      await trx("stored_files").whereIn("id", ids).update({ status: "deleted" });
      keys.push(photo.objectKey, ...(photo.thumbKey ? [photo.thumbKey] : []));
    }
    const caption = (await trx("stored_files").where({ id: photo.fileId }).first("original_name"))?.original_name ?? null;
    await writeAudit(
      { actor, action: "inspection.photo_removed", entityType: "inspection", entityId: inspectionId, vesselId: row.vesselId, detail: { photoId, file: caption, objectsDeleted: keys.length } },
      trx,
    );
    return keys;
  });
  for (const k of keys) await removeObject(k);
  return { deletedObjects: keys.length };
}

/** A presigned upload URL is good for minutes; a slot still pending after this was abandoned. */
const ABANDONED_AFTER_MS = 24 * 3_600_000;

/**
 * Removes uploads that were started but never completed (the tab closed, the network
 * dropped for good): the object, if any, leaves the store and the ledger row is marked
 * deleted. Runs whenever a new slot is handed out, so no job scheduler is needed.
 */
export async function purgeAbandonedUploads(db: Knex = defaultDb, now = Date.now()): Promise<number> {
  const stale = await db("stored_files")
    .where({ status: "pending" })
    .where("created_at", "<", new Date(now - ABANDONED_AFTER_MS))
    .limit(100)
    .select<{ id: number; object_key: string }[]>("id", "object_key");
  for (const f of stale) await discard(db, f.id, f.object_key);
  return stale.length;
}
