import { NextResponse } from "next/server";
import { notFound, parseId, withPermission } from "@/lib/auth/api";
import { getUnitAnalysis } from "@/lib/analysis/queries";

export const dynamic = "force-dynamic";

// GET /api/units/:unitId/analysis – readings, wear, rates, projections with intervals, rings and band of one unit
export const GET = withPermission<{ unitId: string }>("fleet.read", async (_req, { user, params }) => {
  const data = await getUnitAnalysis(user, parseId(params.unitId, "Unit"));
  if (!data) throw notFound("Unit not found.");
  return NextResponse.json(data);
});
