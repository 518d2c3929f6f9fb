import "server-only";
import { db } from "@/lib/db/knex";

export type RingHistoryPoint = {
  inspectionId: number;
  date: string;
  engineHours: number;
  position: number;
  closedGapMm: number | null;
  gapMeasuredIn: "gauge_ring" | "liner_unworn" | "liner_worn";
  grooveClearanceMm: number | null;
  renewed: boolean;
};

/**
 * Every ring reading of a unit's approved inspections, oldest first, for the unit page's ring
 * chart and table. Read from the record itself (the stored analysis keeps only the latest set).
 * The caller has already checked the unit is on the person's vessels.
 */
export async function getRingHistory(unitId: number): Promise<RingHistoryPoint[]> {
  const rows = await db("ring_readings as r")
    .join("inspections as i", "i.id", "r.inspection_id")
    .where("i.unit_id", unitId)
    .where("i.state", "approved")
    .orderBy([{ column: "i.inspected_on" }, { column: "i.id" }, { column: "r.ring_position" }])
    .select(
      "i.id as inspectionId",
      "i.inspected_on as date",
      "i.engine_hours as engineHours",
      "r.ring_position as position",
      "r.closed_gap_mm as closedGapMm",
      "r.gap_measured_in as gapMeasuredIn",
      "r.groove_clearance_mm as grooveClearanceMm",
      "r.renewed",
    );
  return rows.map((r: RingHistoryPoint) => ({ ...r, renewed: !!r.renewed }));
}
