import "server-only";
import type { Knex } from "knex";
import { db } from "@/lib/db/knex";
import { iso } from "./row-values";

type Conn = Knex | Knex.Transaction;

export type AuditRow = { id: number; at: string; actorName: string | null; action: string; entityId: string; detail: Record<string, unknown> | null };

/** The audit trail of an inspection and every version in its amendment chain, oldest first. */
export async function listInspectionAudit(inspectionId: number, conn: Conn = db): Promise<AuditRow[]> {
  const ids = new Set<number>([inspectionId]);
  // Walk back to the first version and forward to the newest, so each version shows the whole story.
  let cursor: number | null = inspectionId;
  for (let i = 0; cursor && i < 50; i++) {
    const r: { supersedes_id: number | null } | undefined = await conn("inspections").where({ id: cursor }).first("supersedes_id");
    cursor = r?.supersedes_id ?? null;
    if (cursor) ids.add(cursor);
  }
  let frontier = [...ids];
  for (let i = 0; frontier.length && i < 50; i++) {
    const next = (await conn("inspections").whereIn("supersedes_id", frontier).select("id")).map((r) => r.id as number).filter((id) => !ids.has(id));
    next.forEach((id) => ids.add(id));
    frontier = next;
  }
  const rows = await conn("audit_log")
    .where("entity_type", "inspection")
    .whereIn("entity_id", [...ids].map(String))
    .orderBy([{ column: "at" }, { column: "id" }])
    .select("id", "at", "actor_name", "action", "entity_id", "detail");
  return rows.map((r) => ({
    id: Number(r.id),
    at: iso(r.at)!,
    actorName: r.actor_name,
    action: r.action,
    entityId: r.entity_id,
    detail: typeof r.detail === "string" ? JSON.parse(r.detail) : r.detail,
  }));
}
