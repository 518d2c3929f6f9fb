import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { inspectionIdOf, readBody, vesselOfInspection } from "@/lib/inspections/http";
import { returnInspection } from "@/lib/inspections/mutations";
import { returnInspectionSchema } from "@/lib/inspections/schemas";

export const dynamic = "force-dynamic";

// POST /api/inspections/:inspectionId/return – submitted → returned for correction, with a comment
export const POST = withRoute<{ inspectionId: string }>(
  "POST /api/inspections/[inspectionId]/return",
  async (req, { user, params }) => {
    const { comment } = await readBody(req, returnInspectionSchema);
    return NextResponse.json(await returnInspection(user, inspectionIdOf(params), comment));
  },
  { vesselOf: vesselOfInspection },
);
