import { NextResponse } from "next/server";
import { parseId, withRoute } from "@/lib/auth/api";
import { getVesselIdIfExists } from "@/lib/fleet/queries";
import { deleteScheduleEntry, updateScheduleEntry } from "@/lib/outlook/mutations";
import { scheduleUpdateSchema } from "@/lib/outlook/schemas";
import { parseRecordId } from "@/lib/validation/ids";

export const dynamic = "force-dynamic";

type P = { vesselId: string; entryId: string };
const vesselOf = async (_req: Request, params: P) => getVesselIdIfExists(parseRecordId(params.vesselId));

// PUT /api/vessels/:vesselId/schedule/:entryId – change a port stay or docking (at the revision seen)
export const PUT = withRoute<P>(
  "PUT /api/vessels/[vesselId]/schedule/[entryId]",
  async (req, { user, vesselId, params }) => {
    const input = scheduleUpdateSchema.parse(await req.json().catch(() => ({})));
    return NextResponse.json(await updateScheduleEntry({ id: user.id, name: user.name }, vesselId!, parseId(params.entryId, "Schedule entry"), input));
  },
  { vesselOf },
);

// DELETE /api/vessels/:vesselId/schedule/:entryId – remove a port stay or docking
export const DELETE = withRoute<P>(
  "DELETE /api/vessels/[vesselId]/schedule/[entryId]",
  async (_req, { user, vesselId, params }) => {
    await deleteScheduleEntry({ id: user.id, name: user.name }, vesselId!, parseId(params.entryId, "Schedule entry"));
    return NextResponse.json({ deleted: true });
  },
  { vesselOf },
);
