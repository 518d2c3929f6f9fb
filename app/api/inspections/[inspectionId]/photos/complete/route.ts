import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { inspectionIdOf, readBody, vesselOfInspection } from "@/lib/inspections/http";
import { completePhotoSchema } from "@/lib/inspections/schemas";
import { completePhoto } from "@/lib/photos/mutations";

export const dynamic = "force-dynamic";

// POST /api/inspections/:inspectionId/photos/complete – check an uploaded photo (type by content, size, checksum, thumbnail) and attach it
export const POST = withRoute<{ inspectionId: string }>(
  "POST /api/inspections/[inspectionId]/photos/complete",
  async (req, { user, params }) => {
    const input = await readBody(req, completePhotoSchema);
    return NextResponse.json(await completePhoto(user, inspectionIdOf(params), input), { status: 201 });
  },
  { vesselOf: vesselOfInspection },
);
