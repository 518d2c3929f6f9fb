import "server-only";
import type { Knex } from "knex";
import { serverEnv } from "@/lib/env";
import { horizonEmail, inspectionReturnedEmail, inspectionSubmittedEmail, overLimitEmail, type MailContent } from "@/lib/mail/templates";
import { queueMail } from "@/lib/mail/outbox";
import { unitsInsideHorizon } from "./horizon-queries";
import { approversToTell, chiefsAndSuperintendents, subscribedUser, type Recipient } from "./recipient-queries";
import { alertKey, type Topic } from "./topics";

/*
 * Alerts are queued in the transaction of the change that causes them (a submit, a return, an
 * approval, a recompute), so they are sent exactly when the change is kept and never when it
 * is rolled back; the outbox sends them after the answer. Each carries a dedupe key of cause
 * and recipient, so a repeated cause queues nothing new.
 */

type Conn = Knex | Knex.Transaction;

export const PREFERENCES_PATH = "/notifications/preferences";

/** An absolute link on this installation (APP_URL). */
export function appLink(path: string): string {
  return new URL(path, serverEnv.APP_URL).href;
}

type AlertSpec = {
  topic: Topic;
  /** What the alert is about, for its dedupe key, e.g. "inspection:42". */
  subject: string;
  vesselId: number;
  linkPath: string;
  recipients: Recipient[];
  /** Never tell people what they did themselves. */
  exceptUserId?: string | null;
  build: (r: { name: string; url: string; preferencesUrl: string }) => MailContent;
};

/** Queues one alert per recipient; answers how many were new. */
export async function queueAlert(conn: Conn, spec: AlertSpec): Promise<number> {
  let queued = 0;
  const url = appLink(spec.linkPath);
  const preferencesUrl = appLink(PREFERENCES_PATH);
  const recipients = spec.recipients.filter((r) => r.id !== spec.exceptUserId);
  if (!recipients.length) return 0;
  // A periodic scan sees the same causes again and again: skip the ones already queued
  // before building their mail (the unique key would refuse them anyway).
  const keys = recipients.map((r) => alertKey(spec.topic, spec.subject, r.id));
  const done = new Set((await conn("mail_outbox").whereIn("dedupe_key", keys).pluck("dedupe_key")) as string[]);
  for (const r of recipients) {
    if (done.has(alertKey(spec.topic, spec.subject, r.id))) continue;
    const content = spec.build({ name: r.name, url, preferencesUrl });
    const fresh = await queueMail(
      { to: r.email, userId: r.id, vesselId: spec.vesselId, kind: spec.topic, linkPath: spec.linkPath, dedupeKey: alertKey(spec.topic, spec.subject, r.id), ...content },
      conn,
    );
    if (fresh) queued++;
  }
  return queued;
}

type InspectionFacts = {
  id: number;
  unitId: number;
  cylinderNo: number;
  vesselId: number;
  vesselName: string;
  inspectedOn: string;
  engineHours: number;
  linerHours: number;
  createdBy: string | null;
  submittedBy: string | null;
  submittedAt: Date | null;
  submitterName: string | null;
  wearLimitMm: number;
  ovalityLimitMm: number;
  version: number;
};

async function inspectionFacts(conn: Conn, id: number): Promise<InspectionFacts> {
  return conn("inspections as i")
    .join("cylinder_units as u", "u.id", "i.unit_id")
    .join("main_engines as e", "e.id", "u.engine_id")
    .join("vessels as v", "v.id", "e.vessel_id")
    .join("engine_profiles as p", "p.id", "e.profile_id")
    .leftJoin("user as s", "s.id", "i.submitted_by")
    .where("i.id", id)
    .first(
      "i.id",
      "i.unit_id as unitId",
      "u.cylinder_no as cylinderNo",
      "e.vessel_id as vesselId",
      "v.name as vesselName",
      "i.inspected_on as inspectedOn",
      "i.engine_hours as engineHours",
      "i.liner_hours as linerHours",
      "i.created_by as createdBy",
      "i.submitted_by as submittedBy",
      "i.submitted_at as submittedAt",
      "s.name as submitterName",
      "p.liner_wear_limit_mm as wearLimitMm",
      "p.ovality_limit_mm as ovalityLimitMm",
      "i.version",
    );
}

const today = () => new Date().toISOString().slice(0, 10);

/**
 * A record was submitted: tell whoever may approve it (the vessel's chiefs who neither entered
 * nor submitted it, else its superintendents). One mail per submission: a record returned and
 * submitted again is a new submission (its revision is in the key).
 */
export async function alertInspectionSubmitted(conn: Conn, id: number, figures: { maxWearMm: number | null; revision: number }): Promise<number> {
  const f = await inspectionFacts(conn, id);
  const recipients = await approversToTell(conn, f.vesselId, { createdBy: f.createdBy, submittedBy: f.submittedBy });
  return queueAlert(conn, {
    topic: "inspection_submitted",
    subject: `inspection:${id}:r${figures.revision}`,
    vesselId: f.vesselId,
    linkPath: `/inspections/${id}`,
    recipients,
    exceptUserId: f.submittedBy,
    build: (r) =>
      inspectionSubmittedEmail({
        ...r,
        vesselName: f.vesselName,
        cylinderNo: f.cylinderNo,
        inspectedOn: f.inspectedOn,
        engineHours: f.engineHours,
        linerHours: f.linerHours,
        submitterName: f.submitterName ?? "Someone",
        submittedOn: (f.submittedAt ? new Date(f.submittedAt) : new Date()).toISOString(),
        maxWearMm: figures.maxWearMm,
        wearLimitMm: f.wearLimitMm,
      }),
  });
}

/** A record was returned: tell the person who entered it, with the comment. */
export async function alertInspectionReturned(conn: Conn, id: number, returner: { id: string; name: string }, comment: string, revision: number): Promise<number> {
  const f = await inspectionFacts(conn, id);
  const author = f.createdBy ? await subscribedUser(conn, "inspection_returned", f.createdBy) : null;
  return queueAlert(conn, {
    topic: "inspection_returned",
    subject: `inspection:${id}:r${revision}`,
    vesselId: f.vesselId,
    linkPath: `/inspections/${id}`,
    recipients: author ? [author] : [],
    exceptUserId: returner.id,
    build: (r) =>
      inspectionReturnedEmail({ ...r, vesselName: f.vesselName, cylinderNo: f.cylinderNo, inspectedOn: f.inspectedOn, returnerName: returner.name, returnedOn: today(), comment }),
  });
}

/**
 * A record was approved: when the unit's analysis, recomputed in the same transaction, puts it
 * over a limit (wear, ovality or a ring), tell the vessel's chiefs and superintendents.
 */
export async function alertInspectionApproved(
  conn: Conn,
  id: number,
  approver: { id: string; name: string },
  figures: { maxWearMm: number | null; maxOvalityMm: number | null },
): Promise<number> {
  const f = await inspectionFacts(conn, id);
  const stored = await conn("unit_analysis").where({ unit_id: f.unitId }).first<{ band: string; summary: unknown } | undefined>("band", "summary");
  const overWear = figures.maxWearMm !== null && figures.maxWearMm >= f.wearLimitMm;
  const overOvality = figures.maxOvalityMm !== null && figures.maxOvalityMm >= f.ovalityLimitMm;
  if (!overWear && !overOvality && stored?.band !== "over_limit") return 0;
  const summary = typeof stored?.summary === "string" ? JSON.parse(stored.summary) : stored?.summary;
  const reasons: string[] = stored?.band === "over_limit" && Array.isArray(summary?.band?.reasons) ? summary.band.reasons.filter((x: unknown) => typeof x === "string") : [];
  return queueAlert(conn, {
    topic: "unit_over_limit",
    subject: `inspection:${id}`,
    vesselId: f.vesselId,
    linkPath: `/units/${f.unitId}`,
    recipients: await chiefsAndSuperintendents(conn, "unit_over_limit", f.vesselId),
    exceptUserId: approver.id,
    build: (r) =>
      overLimitEmail({
        ...r,
        vesselName: f.vesselName,
        cylinderNo: f.cylinderNo,
        inspectedOn: f.inspectedOn,
        approverName: approver.name,
        approvedOn: today(),
        maxWearMm: figures.maxWearMm,
        wearLimitMm: f.wearLimitMm,
        maxOvalityMm: figures.maxOvalityMm,
        ovalityLimitMm: f.ovalityLimitMm,
        reasons: reasons.slice(0, 4),
      }),
  });
}

/**
 * Units whose projected limit has come inside their company's alert horizon: tell the vessel's
 * chiefs and superintendents, once per liner. Called in the transaction of a change that moves
 * projections (an approval, a running-hours entry) and by the periodic scan, since a date also
 * comes inside the horizon just by time passing.
 */
export async function alertUnitsInsideHorizon(
  conn: Conn,
  filter: { unitIds?: number[]; engineIds?: number[]; vesselIds?: number[] } = {},
  now = new Date(),
): Promise<number> {
  const units = await unitsInsideHorizon(conn, filter, now);
  const recipientsOf = new Map<number, Recipient[]>();
  let queued = 0;
  for (const u of units) {
    if (!recipientsOf.has(u.vesselId)) recipientsOf.set(u.vesselId, await chiefsAndSuperintendents(conn, "unit_horizon", u.vesselId));
    queued += await queueAlert(conn, {
      topic: "unit_horizon",
      subject: `liner:${u.linerId}`,
      vesselId: u.vesselId,
      linkPath: `/units/${u.unitId}`,
      recipients: recipientsOf.get(u.vesselId)!,
      build: (r) => horizonEmail({ ...r, ...u }),
    });
  }
  return queued;
}
