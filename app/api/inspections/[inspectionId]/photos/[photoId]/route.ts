import { NextResponse } from "next/server";
import { notFound, parseId, withRoute } from "@/lib/auth/api";
import { inspectionIdOf, vesselOfInspection } from "@/lib/inspections/http";
import { getPhotoObjects } from "@/lib/inspections/photo-queries";
import { deletePhoto } from "@/lib/photos/mutations";
import { presignRead } from "@/lib/photos/storage";

export const dynamic = "force-dynamic";

type P = { inspectionId: string; photoId: string };

// GET /api/inspections/:inspectionId/photos/:photoId?variant=thumb|full – redirect to a short-lived read URL
export const GET = withRoute<P>(
  "GET /api/inspections/[inspectionId]/photos/[photoId]",
  async (req, { params }) => {
    const photo = await getPhotoObjects(inspectionIdOf(params), parseId(params.photoId, "Photo"));
    if (!photo || photo.status !== "stored") throw notFound("Photo not found.");
    const thumb = new URL(req.url).searchParams.get("variant") === "thumb" && photo.thumbKey;
    const photoId = parseId(params.photoId, "Photo");
    const url = thumb ? await presignRead(photo.thumbKey!, "image/jpeg", `photo-${photoId}-preview`) : await presignRead(photo.objectKey, photo.contentType, `photo-${photoId}`);
    return NextResponse.redirect(url, { status: 302, headers: { "cache-control": "private, max-age=60" } });
  },
  { vesselOf: vesselOfInspection },
);

// DELETE /api/inspections/:inspectionId/photos/:photoId – remove a photo from a draft (and its objects when no version uses them)
export const DELETE = withRoute<P>(
  "DELETE /api/inspections/[inspectionId]/photos/[photoId]",
  async (_req, { user, params }) => NextResponse.json(await deletePhoto(user, inspectionIdOf(params), parseId(params.photoId, "Photo"))),
  { vesselOf: vesselOfInspection },
);
