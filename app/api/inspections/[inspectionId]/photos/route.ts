import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { inspectionIdOf, readBody, vesselOfInspection } from "@/lib/inspections/http";
import { presignPhotoSchema } from "@/lib/inspections/schemas";
import { createPhotoSlot } from "@/lib/photos/mutations";

export const dynamic = "force-dynamic";

// POST /api/inspections/:inspectionId/photos – reserve a photo upload: a presigned PUT URL for the object store
export const POST = withRoute<{ inspectionId: string }>(
  "POST /api/inspections/[inspectionId]/photos",
  async (req, { user, params }) => {
    const input = await readBody(req, presignPhotoSchema);
    return NextResponse.json(await createPhotoSlot(user, inspectionIdOf(params), input), { status: 201 });
  },
  { vesselOf: vesselOfInspection },
);
