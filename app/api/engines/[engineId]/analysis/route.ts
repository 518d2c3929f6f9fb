import { NextResponse } from "next/server";
import { notFound, parseId, withRoute } from "@/lib/auth/api";
import { getEngineAnalysis } from "@/lib/analysis/queries";
import { getEngineVesselId } from "@/lib/fleet/queries";
import { parseRecordId } from "@/lib/validation/ids";

export const dynamic = "force-dynamic";

type P = { engineId: string };

// GET /api/engines/:engineId/analysis – the stored per-unit analysis of every unit of one main engine
export const GET = withRoute<P>(
  "GET /api/engines/[engineId]/analysis",
  async (_req, { user, params }) => {
    const data = await getEngineAnalysis(user, parseId(params.engineId, "Engine"));
    if (!data) throw notFound("Engine not found.");
    return NextResponse.json(data);
  },
  { vesselOf: async (_req, params) => getEngineVesselId(parseRecordId(params.engineId)) },
);
