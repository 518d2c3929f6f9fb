import { NextResponse } from "next/server";
import { notFound, parseId, withRoute } from "@/lib/auth/api";
import { getUnitAnalysis } from "@/lib/analysis/queries";
import { getUnitVesselId } from "@/lib/fleet/queries";
import { parseRecordId } from "@/lib/validation/ids";

export const dynamic = "force-dynamic";

type P = { unitId: string };

// GET /api/units/:unitId/analysis – readings, wear, rates, projections with intervals, rings and band of one unit
export const GET = withRoute<P>(
  "GET /api/units/[unitId]/analysis",
  async (_req, { user, params }) => {
    const data = await getUnitAnalysis(user, parseId(params.unitId, "Unit"));
    if (!data) throw notFound("Unit not found.");
    return NextResponse.json(data);
  },
  { vesselOf: async (_req, params) => getUnitVesselId(parseRecordId(params.unitId)) },
);
