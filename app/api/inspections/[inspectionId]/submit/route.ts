import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { inspectionIdOf, readBody, vesselOfInspection } from "@/lib/inspections/http";
import { submitInspection } from "@/lib/inspections/mutations";
import { submitInspectionSchema } from "@/lib/inspections/schemas";

export const dynamic = "force-dynamic";

// POST /api/inspections/:inspectionId/submit – draft or returned → submitted (400 lists what is missing)
export const POST = withRoute<{ inspectionId: string }>(
  "POST /api/inspections/[inspectionId]/submit",
  async (req, { user, params }) => {
    const { revision } = await readBody(req, submitInspectionSchema);
    return NextResponse.json(await submitInspection(user, inspectionIdOf(params), revision));
  },
  { vesselOf: vesselOfInspection },
);
