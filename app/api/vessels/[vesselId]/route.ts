import { NextResponse } from "next/server";
import { notFound, withRoute } from "@/lib/auth/api";
import { getVessel, getVesselIdIfExists } from "@/lib/fleet/queries";
import { parseRecordId } from "@/lib/validation/ids";

export const dynamic = "force-dynamic";

// GET /api/vessels/:vesselId – one vessel with its main engines (caller must be assigned to it)
export const GET = withRoute<{ vesselId: string }>(
  "GET /api/vessels/[vesselId]",
  async (_req, { user, vesselId }) => {
    const vessel = await getVessel(user, vesselId!);
    if (!vessel) throw notFound("Vessel not found.");
    return NextResponse.json({ vessel });
  },
  { vesselOf: async (_req, params) => getVesselIdIfExists(parseRecordId(params.vesselId)) },
);
