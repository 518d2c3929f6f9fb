import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { getVesselIdIfExists } from "@/lib/fleet/queries";
import { createScheduleEntry } from "@/lib/outlook/mutations";
import { getSchedule } from "@/lib/outlook/queries";
import { scheduleEntrySchema } from "@/lib/outlook/schemas";
import { parseRecordId } from "@/lib/validation/ids";

export const dynamic = "force-dynamic";

type P = { vesselId: string };
const vesselOf = async (_req: Request, params: P) => getVesselIdIfExists(parseRecordId(params.vesselId));

// GET /api/vessels/:vesselId/schedule – the ship's port stays and dockings from a month back on
export const GET = withRoute<P>(
  "GET /api/vessels/[vesselId]/schedule",
  async (_req, { vesselId }) => NextResponse.json({ schedule: await getSchedule([vesselId!]) }),
  { vesselOf },
);

// POST /api/vessels/:vesselId/schedule – add a port stay or docking
export const POST = withRoute<P>(
  "POST /api/vessels/[vesselId]/schedule",
  async (req, { user, vesselId }) => {
    const input = scheduleEntrySchema.parse(await req.json().catch(() => ({})));
    const id = await createScheduleEntry({ id: user.id, name: user.name }, vesselId!, input);
    return NextResponse.json({ id, revision: 1 }, { status: 201 });
  },
  { vesselOf },
);
