import "server-only";
import type { Knex } from "knex";
import type { UnitSummary } from "@/lib/analysis/compute";
import { db } from "@/lib/db/knex";

type Conn = Knex | Knex.Transaction;

/** The unit's stored analysis (band, rates, projections), as the fleet screens read it. */
export async function getStoredUnitSummary(unitId: number, conn: Conn = db): Promise<UnitSummary | null> {
  const r = await conn("unit_analysis").where({ unit_id: unitId }).first("summary");
  if (!r) return null;
  return (typeof r.summary === "string" ? JSON.parse(r.summary) : r.summary) as UnitSummary;
}
