import { NextResponse } from "next/server";
import { notFound, parseId, withPermission } from "@/lib/auth/api";
import { getEngineAnalysis } from "@/lib/analysis/queries";

export const dynamic = "force-dynamic";

// GET /api/engines/:engineId/analysis – the stored per-unit analysis of every unit of one main engine
export const GET = withPermission<{ engineId: string }>("fleet.read", async (_req, { user, params }) => {
  const data = await getEngineAnalysis(user, parseId(params.engineId, "Engine"));
  if (!data) throw notFound("Engine not found.");
  return NextResponse.json(data);
});
