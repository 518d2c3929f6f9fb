import "server-only";
import type { Knex } from "knex";
import type { Role } from "@/lib/auth/roles";
import { whereVesselInScope } from "@/lib/auth/scope";
import type { CurrentUser } from "@/lib/auth/session";
import { db } from "@/lib/db/knex";
import type { NotificationState } from "./schemas";
import { isTopic, topicsFor, type Topic } from "./topics";

/** Each topic that concerns the person's role, on or off (no stored row means on). */
export async function getPreferences(user: { id: string; role: Role }): Promise<{ topic: Topic; enabled: boolean }[]> {
  const rows = await db("notification_preferences").where({ user_id: user.id }).select<{ topic: string; enabled: number | boolean }[]>("topic", "enabled");
  const stored = new Map(rows.filter((r) => isTopic(r.topic)).map((r) => [r.topic, !!r.enabled]));
  return topicsFor(user.role).map((topic) => ({ topic, enabled: stored.get(topic) ?? true }));
}

export type NotificationRow = {
  id: number;
  createdAt: string;
  sentAt: string | null;
  to: string;
  recipientName: string | null;
  kind: string;
  subject: string;
  state: NotificationState;
  failure: "bounced" | "gave_up" | null;
  attempts: number;
  /** The mail server's last answer; for the administrator only. */
  lastError: string | null;
  nextAttemptAt: string | null;
  linkPath: string | null;
  vesselName: string | null;
};

const STATUSES: Record<NotificationState, string[]> = { queued: ["pending", "sending"], sent: ["sent"], failed: ["failed"] };
const iso = (d: unknown) => (d ? new Date(d as string).toISOString() : null);

/**
 * Scoped like the records: the administrator sees every mail; everyone else sees mail to
 * themselves and mail about the vessels they are assigned to. Mail without a vessel to
 * someone else (invitations, password resets) is the administrator's only. Never the body:
 * a reset or invitation mail holds a one-time link.
 */
function scoped(q: Knex.QueryBuilder, user: CurrentUser): Knex.QueryBuilder {
  if (user.role === "admin") return q;
  return q.where((w) => {
    w.where("m.user_id", user.id);
    w.orWhere((v) => whereVesselInScope(v.whereNotNull("m.vessel_id"), user, "m.vessel_id"));
  });
}

/** The newest mail the person may see, optionally one state only. */
export async function listNotifications(user: CurrentUser, filter: { state?: NotificationState }, limit = 200): Promise<NotificationRow[]> {
  const q = scoped(db("mail_outbox as m").leftJoin("user as u", "u.id", "m.user_id").leftJoin("vessels as v", "v.id", "m.vessel_id"), user);
  if (filter.state) q.whereIn("m.status", STATUSES[filter.state]);
  const rows = await q
    .orderBy("m.id", "desc")
    .limit(limit)
    .select(
      "m.id",
      "m.created_at as createdAt",
      "m.sent_at as sentAt",
      "m.to_address as to",
      "u.name as recipientName",
      "m.kind",
      "m.subject",
      "m.status",
      "m.failure",
      "m.attempts",
      "m.last_error as lastError",
      "m.next_attempt_at as nextAttemptAt",
      "m.link_path as linkPath",
      "v.name as vesselName",
    );
  const admin = user.role === "admin";
  return rows.map((r: Record<string, unknown>) => ({
    id: Number(r.id),
    createdAt: iso(r.createdAt)!,
    sentAt: iso(r.sentAt),
    to: String(r.to),
    recipientName: (r.recipientName as string | null) ?? null,
    kind: String(r.kind),
    subject: String(r.subject),
    state: r.status === "sent" ? "sent" : r.status === "failed" ? "failed" : "queued",
    failure: (r.failure as NotificationRow["failure"]) ?? null,
    attempts: Number(r.attempts),
    lastError: admin ? ((r.lastError as string | null) ?? null) : null,
    nextAttemptAt: r.status === "pending" || r.status === "sending" ? iso(r.nextAttemptAt) : null,
    linkPath: (r.linkPath as string | null) ?? null,
    vesselName: (r.vesselName as string | null) ?? null,
  }));
}

export type FailedAddress = { address: string; recipientName: string | null; failed: number; bounced: boolean; lastAt: string; lastError: string | null };

/** For the administrator: each address with undelivered mail, the latest failure first. */
export async function listFailedAddresses(limit = 50): Promise<FailedAddress[]> {
  const rows = await db("mail_outbox as m")
    .leftJoin("user as u", "u.id", "m.user_id")
    .where("m.status", "failed")
    .groupBy("m.to_address")
    .orderBy("lastId", "desc")
    .limit(limit)
    .select(
      "m.to_address as address",
      db.raw("MAX(u.name) as recipientName"),
      db.raw("COUNT(*) as failed"),
      db.raw("MAX(m.failure = 'bounced') as bounced"),
      db.raw("MAX(m.id) as lastId"),
      db.raw("MAX(m.created_at) as lastAt"),
      db.raw("SUBSTRING_INDEX(GROUP_CONCAT(m.last_error ORDER BY m.id DESC SEPARATOR '\\n'), '\\n', 1) as lastError"),
    );
  return rows.map((r: Record<string, unknown>) => ({
    address: String(r.address),
    recipientName: (r.recipientName as string | null) ?? null,
    failed: Number(r.failed),
    bounced: Number(r.bounced) === 1,
    lastAt: iso(r.lastAt)!,
    lastError: (r.lastError as string | null) ?? null,
  }));
}

/** How many mails are undelivered for good (the admin overview's tile). */
export async function countFailedMail(): Promise<number> {
  const row = await db("mail_outbox").where({ status: "failed" }).count<{ n: number }[]>({ n: "*" }).first();
  return Number(row?.n ?? 0);
}
