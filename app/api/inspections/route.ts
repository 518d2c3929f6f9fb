import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { vesselOfUnitInBody, readBody } from "@/lib/inspections/http";
import { createInspection } from "@/lib/inspections/mutations";
import { createInspectionSchema } from "@/lib/inspections/schemas";

export const dynamic = "force-dynamic";

// POST /api/inspections – open a draft inspection of a unit (idempotent on clientToken)
export const POST = withRoute<Record<string, string>>(
  "POST /api/inspections",
  async (req, { user }) => {
    const input = await readBody(req, createInspectionSchema);
    const result = await createInspection(user, input);
    return NextResponse.json(result, { status: result.created ? 201 : 200 });
  },
  { vesselOf: vesselOfUnitInBody },
);
