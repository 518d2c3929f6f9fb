import "server-only";
import type { Knex } from "knex";
import { db as defaultDb } from "@/lib/db/knex";
import { queueMail } from "@/lib/mail/outbox";
import { digestEmail } from "@/lib/mail/templates";
import { appLink, PREFERENCES_PATH } from "./alert-mutations";
import { composeDigest, type DigestFacts, type DigestPerson, type DigestRecord } from "./digest";
import { unitsInsideHorizon } from "./horizon-queries";
import { loadFleetOutlook, outlookDigestLines } from "./outlook-alerts";
import { subscribedPeople } from "./recipient-queries";
import { isoWeek } from "./topics";

/*
 * The weekly digest: one mail per person per ISO week, keyed `weekly_digest:<week>:<user>` in
 * the outbox, so running the job again in the same week (or on two instances at once) queues
 * nothing new. The bands of the week are kept the first time the job runs in it; "moved band"
 * compares them with the last week the job ran before.
 */

export type DigestRun = { week: string; people: number; queued: number; alreadyQueued: number; nothingToSay: number };

async function snapshotBands(db: Knex, week: string): Promise<string | null> {
  await db.raw("INSERT IGNORE INTO digest_band_snapshots (iso_week, unit_id, band) SELECT ?, unit_id, band FROM unit_analysis", [week]);
  const prev = await db("digest_band_snapshots").where("iso_week", "<", week).max<{ w: string | null }[]>({ w: "iso_week" }).first();
  return prev?.w ?? null;
}

async function gatherFacts(db: Knex, vesselIds: number[], week: string, previousWeek: string | null, now: Date): Promise<DigestFacts> {
  const unitJoin = (q: Knex.QueryBuilder) =>
    q.join("cylinder_units as u", "u.id", "x.unit_id").join("main_engines as e", "e.id", "u.engine_id").join("vessels as v", "v.id", "e.vessel_id").whereIn("e.vessel_id", vesselIds).whereNull("v.archived_at");
  const records = (await unitJoin(db("inspections as x"))
    .leftJoin("user as s", "s.id", "x.submitted_by")
    .whereIn("x.state", ["submitted", "returned"])
    .whereNull("x.import_id") // past records from a file are approved with their import, not one by one
    .orderBy(["v.name", "u.cylinder_no", "x.id"])
    .select(
      "x.id",
      "e.vessel_id as vesselId",
      "v.name as vesselName",
      "u.cylinder_no as cylinderNo",
      "x.inspected_on as inspectedOn",
      "x.state",
      "x.created_by as createdBy",
      "x.submitted_by as submittedBy",
      "s.name as byName",
    )) as DigestRecord[];
  const bandMoves = previousWeek
    ? await unitJoin(db("digest_band_snapshots as x"))
        .join("digest_band_snapshots as p", (j) => j.on("p.unit_id", "x.unit_id").andOnVal("p.iso_week", previousWeek))
        .where("x.iso_week", week)
        .whereRaw("p.band <> x.band")
        .orderBy(["v.name", "u.cylinder_no"])
        .select("x.unit_id as unitId", "e.vessel_id as vesselId", "v.name as vesselName", "u.cylinder_no as cylinderNo", "p.band as from", "x.band as to")
    : [];
  const limits = await unitsInsideHorizon(db, { vesselIds }, now);
  const { renewals, shortfalls } = outlookDigestLines(await loadFleetOutlook(db, now.toISOString().slice(0, 10), { vessels: vesselIds }));
  return { records, bandMoves, limits, renewals, shortfalls };
}

/** Runs the week's digest once; safe to repeat and to run on two instances at once. */
export async function runWeeklyDigest(opts: { db?: Knex; now?: Date } = {}): Promise<DigestRun> {
  const db = opts.db ?? defaultDb;
  const now = opts.now ?? new Date();
  const week = isoWeek(now);
  const previousWeek = await snapshotBands(db, week);
  const people = await subscribedPeople(db, "weekly_digest", ["engineer", "chief_engineer", "superintendent"]);
  const assignments = people.length
    ? await db("user_vessels").whereIn("user_id", people.map((p) => p.id)).select<{ user_id: string; vessel_id: number }[]>("user_id", "vessel_id")
    : [];
  const vesselsOf = new Map<string, number[]>();
  for (const a of assignments) vesselsOf.set(a.user_id, [...(vesselsOf.get(a.user_id) ?? []), a.vessel_id]);
  const allVessels = [...new Set(assignments.map((a) => a.vessel_id))];
  const facts = await gatherFacts(db, allVessels.length ? allVessels : [-1], week, previousWeek, now);

  const run: DigestRun = { week, people: 0, queued: 0, alreadyQueued: 0, nothingToSay: 0 };
  const url = appLink("/");
  const preferencesUrl = appLink(PREFERENCES_PATH);
  for (const p of people) {
    const person: DigestPerson = { id: p.id, role: p.role, vesselIds: vesselsOf.get(p.id) ?? [] };
    if (!person.vesselIds.length) continue;
    run.people++;
    const digest = composeDigest(person, facts);
    if (!digest) {
      run.nothingToSay++;
      continue;
    }
    const content = digestEmail({ name: p.name, url, preferencesUrl, week, ...digest });
    const fresh = await queueMail({ to: p.email, userId: p.id, kind: "weekly_digest", linkPath: "/", dedupeKey: `weekly_digest:${week}:${p.id}`, ...content }, db);
    if (fresh) run.queued++;
    else run.alreadyQueued++;
  }
  return run;
}
