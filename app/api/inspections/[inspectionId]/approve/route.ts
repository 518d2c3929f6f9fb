import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { inspectionIdOf, vesselOfInspection } from "@/lib/inspections/http";
import { approveInspection } from "@/lib/inspections/mutations";

export const dynamic = "force-dynamic";

// POST /api/inspections/:inspectionId/approve – submitted → approved; an approved amendment supersedes its original
export const POST = withRoute<{ inspectionId: string }>(
  "POST /api/inspections/[inspectionId]/approve",
  async (_req, { user, params }) => NextResponse.json(await approveInspection(user, inspectionIdOf(params))),
  { vesselOf: vesselOfInspection },
);
