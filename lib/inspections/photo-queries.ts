import "server-only";
import type { Knex } from "knex";
import { db } from "@/lib/db/knex";
import { iso } from "./row-values";
import type { PhotoDto } from "./schemas";

type Conn = Knex | Knex.Transaction;

/** The stored photos of one inspection, oldest first. */
export async function listPhotos(inspectionId: number, conn: Conn = db): Promise<PhotoDto[]> {
  const rows = await conn("inspection_photos as p")
    .join("stored_files as f", "f.id", "p.file_id")
    .leftJoin("profile_stations as s", "s.id", "p.station_id")
    .where("p.inspection_id", inspectionId)
    .where("f.status", "stored")
    .orderBy("p.id")
    .select(
      "p.id",
      "p.caption",
      "s.station_key",
      "p.ring_position",
      "p.thumbnail_file_id",
      "p.created_at",
      "f.content_type",
      "f.size_bytes",
      "f.sha256",
      "f.original_name",
    );
  return rows.map((r) => ({
    id: r.id,
    caption: r.caption,
    stationKey: r.station_key ?? null,
    ringPosition: r.ring_position,
    contentType: r.content_type,
    sizeBytes: Number(r.size_bytes),
    sha256: r.sha256,
    originalName: r.original_name,
    hasThumbnail: r.thumbnail_file_id != null,
    createdAt: iso(r.created_at)!,
  }));
}

/** The stored objects behind one photo of one inspection. */
export async function getPhotoObjects(inspectionId: number, photoId: number, conn: Conn = db) {
  const r = await conn("inspection_photos as p")
    .join("stored_files as f", "f.id", "p.file_id")
    .leftJoin("stored_files as t", "t.id", "p.thumbnail_file_id")
    .where({ "p.id": photoId, "p.inspection_id": inspectionId })
    .first("p.id", "p.file_id", "p.thumbnail_file_id", "f.object_key", "f.content_type", "f.status", "f.original_name", "t.object_key as thumb_key");
  if (!r) return null;
  return {
    id: r.id as number,
    fileId: r.file_id as number,
    thumbnailFileId: (r.thumbnail_file_id as number | null) ?? null,
    objectKey: r.object_key as string,
    contentType: r.content_type as string,
    status: r.status as string,
    originalName: (r.original_name as string | null) ?? null,
    thumbKey: (r.thumb_key as string | null) ?? null,
  };
}

/** A pending upload's ledger row, for the "complete" step. */
export async function getPendingFile(fileId: number, conn: Conn = db) {
  return conn("stored_files")
    .where({ id: fileId })
    .first("id", "object_key", "kind", "content_type", "size_bytes", "status", "vessel_id", "uploaded_by", "original_name") as Promise<
    | {
        id: number;
        object_key: string;
        kind: string;
        content_type: string;
        size_bytes: number;
        status: string;
        vessel_id: number | null;
        uploaded_by: string | null;
        original_name: string | null;
      }
    | undefined
  >;
}
