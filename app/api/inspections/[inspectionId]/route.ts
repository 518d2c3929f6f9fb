import { NextResponse } from "next/server";
import { notFound, withRoute } from "@/lib/auth/api";
import { inspectionIdOf, readBody, vesselOfInspection } from "@/lib/inspections/http";
import { discardDraft, saveDraft } from "@/lib/inspections/mutations";
import { getInspectionDto } from "@/lib/inspections/queries";
import { saveDraftSchema } from "@/lib/inspections/schemas";

export const dynamic = "force-dynamic";

type P = { inspectionId: string };

// GET /api/inspections/:inspectionId – one inspection with readings, rings, checklist and photos
export const GET = withRoute<P>(
  "GET /api/inspections/[inspectionId]",
  async (_req, { params }) => {
    const dto = await getInspectionDto(inspectionIdOf(params));
    if (!dto) throw notFound("Inspection not found.");
    return NextResponse.json(dto);
  },
  { vesselOf: vesselOfInspection },
);

// PUT /api/inspections/:inspectionId – save the whole draft; 409 with the server's copy when `revision` is stale
export const PUT = withRoute<P>(
  "PUT /api/inspections/[inspectionId]",
  async (req, { user, params }) => {
    const { revision, draft, saveId } = await readBody(req, saveDraftSchema, { fieldPrefix: "draft." });
    const saved = await saveDraft(user, inspectionIdOf(params), revision, draft, undefined, { saveId });
    return NextResponse.json(saved);
  },
  { vesselOf: vesselOfInspection },
);

// DELETE /api/inspections/:inspectionId – discard a draft opened by mistake (its author only; audited)
export const DELETE = withRoute<P>(
  "DELETE /api/inspections/[inspectionId]",
  async (_req, { user, params }) => NextResponse.json(await discardDraft(user, inspectionIdOf(params))),
  { vesselOf: vesselOfInspection },
);
