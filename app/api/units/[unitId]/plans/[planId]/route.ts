import { NextResponse } from "next/server";
import { parseId, withRoute } from "@/lib/auth/api";
import { getUnitVesselId } from "@/lib/fleet/queries";
import { updatePlan } from "@/lib/outlook/mutations";
import { planUpdateSchema } from "@/lib/outlook/schemas";
import { parseRecordId } from "@/lib/validation/ids";

export const dynamic = "force-dynamic";

type P = { unitId: string; planId: string };

// PUT /api/units/:unitId/plans/:planId – move a plan on (confirm, drop, pencil in again) or change its day, opportunity or spare
export const PUT = withRoute<P>(
  "PUT /api/units/[unitId]/plans/[planId]",
  async (req, { user, params }) => {
    const input = planUpdateSchema.parse(await req.json().catch(() => ({})));
    const result = await updatePlan({ id: user.id, name: user.name }, parseId(params.unitId, "Unit"), parseId(params.planId, "Plan"), input);
    return NextResponse.json(result);
  },
  { vesselOf: async (_req, params) => getUnitVesselId(parseRecordId(params.unitId)) },
);
