import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { inspectionIdOf, readBody, vesselOfInspection } from "@/lib/inspections/http";
import { amendInspection } from "@/lib/inspections/mutations";
import { amendInspectionSchema } from "@/lib/inspections/schemas";

export const dynamic = "force-dynamic";

// POST /api/inspections/:inspectionId/amend – open an amendment (new draft version) of an approved inspection
export const POST = withRoute<{ inspectionId: string }>(
  "POST /api/inspections/[inspectionId]/amend",
  async (req, { user, params }) => {
    const { reason, clientToken } = await readBody(req, amendInspectionSchema);
    const result = await amendInspection(user, inspectionIdOf(params), reason, clientToken);
    return NextResponse.json(result, { status: result.created ? 201 : 200 });
  },
  { vesselOf: vesselOfInspection },
);
