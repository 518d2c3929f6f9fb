import "server-only";
import type { Knex } from "knex";
import { listCompanySettings } from "@/lib/company/settings";
import { day } from "@/lib/format";
import { addDays } from "@/lib/wear/calendar";
import { orderByEmail, planMissedEmail, probabilityEmail } from "@/lib/mail/templates";
import { loadOutlook, PART_LABELS, type OutlookBundle } from "@/lib/outlook/load";
import { queueAlert } from "./alert-mutations";
import { chiefsAndSuperintendents, superintendentsOf, type Recipient } from "./recipient-queries";

/*
 * The alerts that come from the renewal outlook (lib/outlook, the same numbers the outlook screen
 * shows): a liner's chance of passing its wear limit by the next overhaul reaching the company's
 * threshold, a renewal plan whose day passed without the renewal, a spare whose order-by date is
 * less than two weeks away. They come with time and with plans, not with one transaction, so the
 * periodic scan looks for them; each goes once per cause and person (the outbox's unique key).
 */

/** A spare's order-by date this close (or past) is worth an alert. */
export const ORDER_BY_WARNING_DAYS = 14;

const daysAfter = (iso: string, days: number) => addDays(iso, days) ?? iso;

/** The outlook over the whole fleet, a year ahead (the scan's and the digest's view). */
export function loadFleetOutlook(db: Knex, today: string, scope: { vessels: "all" | number[] } = { vessels: "all" }): Promise<OutlookBundle> {
  return loadOutlook(db, scope, { today, horizonMonths: 12 });
}

/**
 * Queues the outlook's alerts for the vessels in `scope` (the whole fleet by default): the chance
 * of passing the limit by the next overhaul at or over the company's threshold (chiefs and
 * superintendents, once per liner and overhaul), a plan whose day passed (superintendents, once
 * per plan), a spare short whose order-by date is within ORDER_BY_WARNING_DAYS or past
 * (superintendents of the ships with that engine profile, once per profile, part and number short).
 */
export async function alertFromOutlook(db: Knex, now = new Date(), scope: { vessels: "all" | number[] } = { vessels: "all" }): Promise<number> {
  const today = now.toISOString().slice(0, 10);
  const bundle = await loadFleetOutlook(db, today, scope);
  if (!bundle.rows.length) return 0;
  const settings = await listCompanySettings(db);
  const threshold = new Map(settings.map((s) => [s.companyId, s.alertProbability]));
  const cache = new Map<string, Recipient[]>();
  const people = async (kind: "risk" | "supt", vesselId: number) => {
    const key = `${kind}:${vesselId}`;
    if (!cache.has(key)) {
      cache.set(key, kind === "risk" ? await chiefsAndSuperintendents(db, "unit_probability", vesselId) : await superintendentsOf(db, "plan_missed", vesselId));
    }
    return cache.get(key)!;
  };
  let queued = 0;

  for (const row of bundle.rows) {
    const limit = threshold.get(row.companyId);
    const next = row.overhauls[0];
    const chance = row.exceed[0];
    if (limit !== undefined && next && chance?.kind === "probability" && chance.p >= limit) {
      queued += await queueAlert(db, {
        topic: "unit_probability",
        subject: `unit:${row.unitId}:liner:${row.linerSerial ?? "?"}:overhaul:${Math.round(next.engineHours)}`,
        vesselId: row.vesselId,
        linkPath: `/units/${row.unitId}`,
        recipients: await people("risk", row.vesselId),
        build: (r) =>
          probabilityEmail({ ...r, vesselName: row.vesselName, cylinderNo: row.cylinderNo, part: "liner", probability: chance.p, threshold: limit, nextOverhaulOn: next.date, nextOverhaulHours: next.engineHours }),
      });
    }
    for (const plan of row.plans) {
      if (!plan.missed) continue;
      queued += await queueAlert(db, {
        topic: "plan_missed",
        subject: `plan:${plan.id}`,
        vesselId: row.vesselId,
        linkPath: `/units/${row.unitId}`,
        recipients: await people("supt", row.vesselId),
        build: (r) => planMissedEmail({ ...r, vesselName: row.vesselName, cylinderNo: row.cylinderNo, part: PART_LABELS[plan.part].toLowerCase(), place: plan.opportunity, plannedOn: plan.plannedOn }),
      });
    }
  }

  const soon = daysAfter(today, ORDER_BY_WARNING_DAYS);
  for (const line of bundle.shortfall) {
    if (line.short <= 0 || !line.orderBy || !line.firstShortOn || line.orderBy > soon) continue;
    const rows = bundle.rows.filter((r) => r.profileId === line.profileId);
    const vesselIds = [...new Set(rows.map((r) => r.vesselId))];
    const vesselNames = [...new Set(rows.map((r) => r.vesselName))];
    const profileName = rows[0]?.profileName ?? "engine profile";
    for (const vesselId of vesselIds) {
      queued += await queueAlert(db, {
        topic: "spare_order_by",
        // Not the order-by date: for a renewal already due it moves with each day. A shortfall that
        // grows is a new cause; one that stays the same was told once.
        subject: `spare:${line.profileId}:${line.part}:short-${line.short}`,
        vesselId,
        linkPath: "/outlook/spares",
        recipients: await superintendentsOf(db, "spare_order_by", vesselId),
        build: (r) =>
          orderByEmail({ ...r, profileName, part: PART_LABELS[line.part].toLowerCase(), short: line.short, firstShortOn: line.firstShortOn!, orderBy: line.orderBy!, leadTimeDays: line.leadTimeDays, vesselNames }),
      });
    }
  }
  return queued;
}

/** For the digest: open plans due within `days`, and the spares short, as lines per vessel. */
export function outlookDigestLines(bundle: OutlookBundle, days = 60) {
  const until = daysAfter(bundle.today, days);
  const renewals = bundle.rows.flatMap((row) =>
    row.plans
      .filter((p) => p.plannedOn >= bundle.today && p.plannedOn <= until)
      .map((p) => ({ vesselId: row.vesselId, text: `${row.vesselName}, cylinder ${row.cylinderNo}: ${PART_LABELS[p.part].toLowerCase()} renewal on ${day(p.plannedOn)}${p.opportunity ? ` at ${p.opportunity}` : ""}` })),
  );
  const shortfalls = bundle.shortfall
    .filter((l) => l.short > 0)
    .flatMap((l) => {
      const rows = bundle.rows.filter((r) => r.profileId === l.profileId);
      const text = `${rows[0]?.profileName ?? "Engine profile"}: ${l.short} ${PART_LABELS[l.part].toLowerCase()}${l.short === 1 ? "" : "s"} short${l.firstShortOn ? ` from ${day(l.firstShortOn)}` : ""}${l.orderBy ? `, order by ${day(l.orderBy)}` : ""}`;
      return [...new Set(rows.map((r) => r.vesselId))].map((vesselId) => ({ vesselId, text }));
    });
  return { renewals, shortfalls };
}
