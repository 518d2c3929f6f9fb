import { NextResponse } from "next/server";
import { parseId, withRoute } from "@/lib/auth/api";
import { getUnitVesselId } from "@/lib/fleet/queries";
import { createPlan } from "@/lib/outlook/mutations";
import { planCreateSchema } from "@/lib/outlook/schemas";
import { parseRecordId } from "@/lib/validation/ids";

export const dynamic = "force-dynamic";

type P = { unitId: string };

// POST /api/units/:unitId/plans – plan the renewal of the unit's liner or ring set (409 when one is open)
export const POST = withRoute<P>(
  "POST /api/units/[unitId]/plans",
  async (req, { user, params }) => {
    const input = planCreateSchema.parse(await req.json().catch(() => ({})));
    const plan = await createPlan({ id: user.id, name: user.name }, parseId(params.unitId, "Unit"), input);
    return NextResponse.json(plan, { status: 201 });
  },
  { vesselOf: async (_req, params) => getUnitVesselId(parseRecordId(params.unitId)) },
);
