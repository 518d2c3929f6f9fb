import "server-only";
import type { Knex } from "knex";
import { db as defaultDb } from "@/lib/db/knex";

export type AuditEntry = {
  actor: { id: string; name: string } | null;
  /** verb in dotted form, e.g. "user.deactivate", "profile.update" */
  action: string;
  entityType: string;
  entityId: string | number;
  vesselId?: number | null;
  detail?: Record<string, unknown> | null;
};

function auditRow(entry: AuditEntry) {
  return {
    actor_id: entry.actor?.id ?? null,
    actor_name: entry.actor?.name ?? null,
    action: entry.action,
    entity_type: entry.entityType,
    entity_id: String(entry.entityId),
    vessel_id: entry.vesselId ?? null,
    detail: entry.detail ? JSON.stringify(entry.detail) : null,
  };
}

/** Appends one row to the audit trail; pass the transaction so it commits with the change. */
export async function writeAudit(entry: AuditEntry, db: Knex | Knex.Transaction = defaultDb): Promise<void> {
  await db("audit_log").insert(auditRow(entry));
}

/** Appends many rows to the audit trail in a few statements (an import of past records writes one per record). */
export async function writeAuditMany(entries: readonly AuditEntry[], db: Knex | Knex.Transaction = defaultDb): Promise<void> {
  const rows = entries.map(auditRow);
  for (let i = 0; i < rows.length; i += 2000) await db("audit_log").insert(rows.slice(i, i + 2000));
}
