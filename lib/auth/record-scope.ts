import "server-only";
import { notFound } from "next/navigation";
import { cache } from "react";
import { getEngineVesselId, getUnitVesselId, getVesselIdIfExists } from "@/lib/fleet/queries";
import { getInspectionVesselId } from "@/lib/inspections/queries";
import { parseRecordId } from "@/lib/validation/ids";
import { canSeeVessel } from "./scope";
import { requireUser } from "./session";

export type ScopedRecord = "vessel" | "engine" | "unit" | "inspection";

const vesselOf: Record<ScopedRecord, (id: number) => Promise<number | null>> = {
  vessel: getVesselIdIfExists,
  engine: getEngineVesselId,
  unit: getUnitVesselId,
  inspection: (id) => getInspectionVesselId(id),
};

/**
 * For pages showing one record: the record's id from its address segment when it names a
 * record on one of the caller's vessels; otherwise the not-found page, the same for a
 * malformed id, a missing record and one outside the caller's vessels, so ids cannot be
 * probed. The segment's layout calls it before anything streams, so the answer is an HTTP
 * 404 (a page's own loading skeleton would start the response with 200); the page calls it
 * again for the id, answered from the per-request cache.
 */
export const requireRecordInScope = cache(async (kind: ScopedRecord, rawId: string): Promise<number> => {
  const user = await requireUser();
  const id = parseRecordId(rawId);
  const vesselId = id === null ? null : await vesselOf[kind](id);
  if (id === null || vesselId === null || !canSeeVessel(user, vesselId)) notFound();
  return id;
});
