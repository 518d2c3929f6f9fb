import "server-only";
import type { Knex } from "knex";
import { writeAudit } from "@/lib/audit/mutations";
import type { Role } from "@/lib/auth/roles";
import { db as defaultDb } from "@/lib/db/knex";
import { topicsFor, type Topic } from "./topics";
import { inTransaction } from "@/lib/db/transaction";

/**
 * Saves which e-mails a person gets: every topic that concerns their role is stored on or off
 * (so a later default cannot switch back on what they switched off). Topics outside the role
 * are ignored. In the audit trail.
 */
export async function savePreferences(user: { id: string; name: string; role: Role }, enabled: Topic[], db: Knex = defaultDb): Promise<Topic[]> {
  const topics = topicsFor(user.role);
  const on = topics.filter((t) => enabled.includes(t));
  await inTransaction(db, async (trx) => {
    const rows = topics.map((topic) => ({ user_id: user.id, topic, enabled: on.includes(topic), updated_at: new Date() }));
    if (rows.length) await trx("notification_preferences").insert(rows).onConflict(["user_id", "topic"]).merge(["enabled", "updated_at"]);
    await writeAudit({ actor: user, action: "notifications.preferences", entityType: "user", entityId: user.id, detail: { on } }, trx);
  });
  return on;
}
