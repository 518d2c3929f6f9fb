import { beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { POST as createRoute } from "@/app/api/inspections/route";
import { GET as getRoute, PUT as putRoute } from "@/app/api/inspections/[inspectionId]/route";
import { POST as submitRoute } from "@/app/api/inspections/[inspectionId]/submit/route";
import { POST as approveRoute } from "@/app/api/inspections/[inspectionId]/approve/route";
import { POST as returnRoute } from "@/app/api/inspections/[inspectionId]/return/route";
import { POST as amendRoute } from "@/app/api/inspections/[inspectionId]/amend/route";
import { db } from "@/lib/db/knex";
import { correctTo20C } from "@/lib/wear/correction";
import { randomToken } from "@/lib/inspections/form";
import type { InspectionDraft, InspectionDto } from "@/lib/inspections/schemas";
import { completeDraft, daysAgo, readyUnit } from "../support/inspection-builders";
import { request } from "../support/matrix";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { signInCookie } from "../support/sessions";

/*
 * The inspection workflow through its route handlers, against the real MariaDB: create
 * (idempotent), draft saves with the optimistic lock, refusals that name the field,
 * submit / approve / return, amendments that supersede, and the audit trail. Each test
 * uses its own unit of a world of its own ("insp"), so tests do not see each other's
 * previous inspections.
 */

let world: RoleWorld;
const cookie: Record<string, string> = {};
let units: number[] = [];
let nextUnit = 0;

beforeAll(async () => {
  world = await buildRoleWorld(db, "insp");
  for (const k of ["engineer", "chief", "engineer2", "chief2", "supt"] as const) cookie[k] = await signInCookie(world.users[k].email, WORLD_PASSWORD);
  units = (await db("cylinder_units").where({ engine_id: world.engine1 }).orderBy("cylinder_no").select("id")).map((r) => r.id);
  // Extra units so each test gets a clean one even when the file is re-run against the same database.
  const have = units.length;
  if (have < 40) {
    const maxNo = (await db("cylinder_units").where({ engine_id: world.engine1 }).max({ m: "cylinder_no" }).first())?.m ?? 0;
    await db("cylinder_units").insert(Array.from({ length: 40 - have }, (_, i) => ({ engine_id: world.engine1, cylinder_no: maxNo + i + 1 })));
    units = (await db("cylinder_units").where({ engine_id: world.engine1 }).orderBy("cylinder_no").select("id")).map((r) => r.id);
  }
}, 60_000);

/** A unit with no inspections yet (skips units earlier runs used). */
async function freshUnit(): Promise<number> {
  while (nextUnit < units.length) {
    const id = units[nextUnit++];
    if (!(await db("inspections").where({ unit_id: id }).first("id"))) {
      await readyUnit(id);
      return id;
    }
  }
  throw new Error("no fresh unit left; reset the test database");
}

type Who = "engineer" | "chief" | "engineer2" | "chief2" | "supt" | null;
const as = (who: Who) => asCaller(who ? cookie[who] : null);
const params = (id: number) => ({ params: Promise.resolve({ inspectionId: String(id) }) });

async function call(who: Who, handler: (req: Request, ctx: never) => Promise<Response>, method: string, path: string, body?: unknown, id?: number) {
  as(who);
  const res = await handler(request(method, path, body), (id === undefined ? undefined : params(id)) as never);
  const json = await res.json().catch(() => null);
  return { status: res.status, body: json };
}

async function createDraft(unitId: number, who: Who = "engineer", over: Record<string, unknown> = {}) {
  const ctx = await readyUnit(unitId);
  const engineHours = Math.max(39_000, ctx.previous?.engineHours ?? 0);
  const body = {
    unitId,
    clientToken: randomToken(24),
    inspectedOn: daysAgo(0),
    engineHours,
    linerHours: engineHours - ctx.liner.installedEngineHours + ctx.liner.linerHoursAtInstall,
    linerHoursReason: null,
    crew: "3/E",
    gaugeTempC: 24,
    linerTempC: 31,
    ...over,
  };
  const res = await call(who, createRoute, "POST", "/api/inspections", body);
  return { ...res, ctx, sent: body };
}

async function get(id: number, who: Who = "engineer"): Promise<InspectionDto> {
  const res = await call(who, getRoute, "GET", `/api/inspections/${id}`, undefined, id);
  expect(res.status).toBe(200);
  return res.body as InspectionDto;
}

const put = (id: number, revision: number, draft: unknown, who: Who = "engineer") => call(who, putRoute, "PUT", `/api/inspections/${id}`, { revision, draft }, id);

/** A complete draft saved and submitted through the routes; returns its id. */
async function submitted(unitId: number, wearMm = 0.4): Promise<{ id: number; draft: InspectionDraft }> {
  const created = await createDraft(unitId);
  const id = created.body.id as number;
  const draft = completeDraft(created.ctx, { inspectedOn: daysAgo(0), engineHours: created.sent.engineHours, wearMm });
  expect((await put(id, 1, draft)).status).toBe(200);
  const s = await call("engineer", submitRoute, "POST", `/api/inspections/${id}/submit`, {}, id);
  expect(s.status, JSON.stringify(s.body)).toBe(200);
  return { id, draft };
}

describe("creating an inspection", () => {
  it("opens one draft per client token, however often the request is repeated", async () => {
    const unitId = await freshUnit();
    const first = await createDraft(unitId);
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    as("engineer");
    const again = await createRoute(request("POST", "/api/inspections", first.sent));
    expect(again.status).toBe(200);
    expect((await again.json()).id).toBe(first.body.id);
    const rows = await db("inspections").where({ client_token: first.sent.clientToken }).select("id", "state", "version", "created_by");
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ state: "draft", version: 1, created_by: world.users.engineer.id });
    // Two identical requests at the same moment (a double tap) still make one row.
    const otherUnit = await freshUnit();
    const body = { ...first.sent, unitId: otherUnit, clientToken: randomToken(24) };
    const [a, b] = await Promise.all([createRoute(request("POST", "/api/inspections", body)), createRoute(request("POST", "/api/inspections", body))]);
    expect([a.status, b.status].sort()).toEqual([200, 201]);
    expect(await db("inspections").where({ client_token: body.clientToken }).count({ n: "*" }).first()).toMatchObject({ n: 1 });
    const audit = await db("audit_log").where({ entity_type: "inspection", entity_id: String(first.body.id), action: "inspection.create" }).select("actor_id", "vessel_id", "detail");
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ actor_id: world.users.engineer.id, vessel_id: world.vessel1 });
  });

  it("derives the liner hours and needs a reason to differ from them", async () => {
    const unitId = await freshUnit();
    const noReason = await createDraft(unitId, "engineer", { linerHours: 12_345 });
    expect(noReason.status).toBe(400);
    expect(noReason.body.details.field).toBe("linerHoursReason");
    expect(noReason.body.error).toMatch(/give the reason/);
    const withReason = await createDraft(unitId, "engineer", { linerHours: 12_345, linerHoursReason: "Liner came from another unit with its own hours." });
    expect(withReason.status).toBe(201);
    const row = await db("inspections").where({ id: withReason.body.id }).first("liner_hours", "liner_hours_reason");
    expect(Number(row.liner_hours)).toBe(12_345);
  });

  it("refuses engine hours below the previous inspection's, and text where a number belongs, naming the field", async () => {
    const unitId = await freshUnit();
    const { id } = await submitted(unitId);
    expect((await call("chief", approveRoute, "POST", `/api/inspections/${id}/approve`, {}, id)).status).toBe(200);
    const below = await createDraft(unitId, "engineer", { engineHours: 30_000, linerHours: 20_000 });
    expect(below.status).toBe(400);
    expect(below.body.details.field).toBe("engineHours");
    expect(below.body.error).toMatch(/below the 39,000 h of the previous inspection/);
    const text = await createDraft(unitId, "engineer", { engineHours: "forty thousand" });
    expect(text.status).toBe(400);
    expect(text.body.details.field).toBe("engineHours");
    expect(text.body.error).toMatch(/engine running hours must be a number/);
  });

  it("answers 403 to a role that cannot create, and 404 to crew of another vessel (as for a unit that is not there)", async () => {
    const unitId = await freshUnit();
    expect((await createDraft(unitId, "supt")).status).toBe(403);
    expect((await createDraft(unitId, "engineer2")).status).toBe(404);
    expect((await createDraft(unitId, null)).status).toBe(401);
  });
});

describe("saving a draft", () => {
  it("saves the whole draft with the revision it was based on, and refuses a stale revision with the server's copy", async () => {
    const unitId = await freshUnit();
    const created = await createDraft(unitId);
    const id = created.body.id as number;
    const draft = completeDraft(created.ctx, { inspectedOn: daysAgo(0), engineHours: created.sent.engineHours });
    // An inch reading as the form sends it: converted to mm in the browser (exact 25.4), unit kept.
    draft.readings[2] = { ...draft.readings[2], diameterMm: Math.round(23.6378 * 25.4 * 1000) / 1000, enteredUnit: "in" };
    const first = await put(id, 1, draft);
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body.revision).toBe(2);

    // The second device still holds revision 1: its save is refused, nothing is overwritten.
    const other = structuredClone(draft);
    other.readings[0].diameterMm = 600.5;
    const stale = await put(id, 1, other, "chief");
    expect(stale.status).toBe(409);
    expect(stale.body.details.server.revision).toBe(2);
    expect(stale.body.details.server.draft.readings[0].diameterMm).toBe(draft.readings[0].diameterMm);
    const now = await get(id);
    expect(now.revision).toBe(2);
    expect(now.draft.readings).toHaveLength(draft.readings.length);
    expect(now.draft.readings[2]).toMatchObject({ enteredUnit: "in", diameterMm: 600.4 });
    expect(now.draft.checklist.tally.map((t) => [t.countIn, t.countOut])).toEqual([
      [14, 14],
      [6, 6],
    ]);
  });

  it("lets exactly one of two simultaneous saves of the same revision through", async () => {
    const unitId = await freshUnit();
    const created = await createDraft(unitId);
    const id = created.body.id as number;
    const draft = completeDraft(created.ctx, { inspectedOn: daysAgo(0), engineHours: created.sent.engineHours });
    as("engineer");
    const [a, b] = await Promise.all([
      putRoute(request("PUT", `/api/inspections/${id}`, { revision: 1, draft }), params(id)),
      putRoute(request("PUT", `/api/inspections/${id}`, { revision: 1, draft }), params(id)),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    expect((await get(id)).revision).toBe(2);
  });

  it.each([
    ["a station the profile lacks", (d: InspectionDraft) => (d.readings[0].stationKey = "zz"), "readings.0.stationKey", /not in the engine profile/],
    ["a negative diameter", (d: InspectionDraft) => (d.readings[1].diameterMm = -600), "readings.1.diameterMm", /more than 0 mm/],
    ["text in a number", (d: InspectionDraft) => ((d.readings[1] as unknown as { diameterMm: string }).diameterMm = "600,1x"), "readings.1.diameterMm", /must be a number/],
    ["a ring the profile lacks", (d: InspectionDraft) => (d.rings[0].position = 9), "rings.0.position", /Ring 9 is not in the engine profile/],
    ["an unknown axis", (d: InspectionDraft) => (d.readings[0].axisKey = "up"), "readings.0.axisKey", /Direction "up"/],
  ])("refuses %s with 400 naming the field, and saves nothing of it", async (_what, spoil, field, message) => {
    const unitId = await freshUnit();
    const created = await createDraft(unitId);
    const id = created.body.id as number;
    const good = completeDraft(created.ctx, { inspectedOn: daysAgo(0), engineHours: created.sent.engineHours });
    expect((await put(id, 1, good)).status).toBe(200);
    const bad = structuredClone(good);
    bad.header.crew = "changed in the refused save";
    spoil(bad);
    const res = await put(id, 2, bad);
    expect(res.status).toBe(400);
    expect(res.body.details.field).toBe(field);
    expect(res.body.error).toMatch(message);
    const after = await get(id);
    expect(after.revision).toBe(2);
    expect(after.draft.header.crew).toBe(good.header.crew);
    expect(after.draft.readings).toEqual(good.readings);
  });
});

describe("submit, approve, return", () => {
  it("submits only a complete record, and a second submit changes nothing", async () => {
    const unitId = await freshUnit();
    const created = await createDraft(unitId);
    const id = created.body.id as number;
    const incomplete = await call("engineer", submitRoute, "POST", `/api/inspections/${id}/submit`, {}, id);
    expect(incomplete.status).toBe(400);
    const fields = (incomplete.body.details.problems as { field: string }[]).map((p) => p.field);
    expect(fields).toEqual(expect.arrayContaining(["readings", "rings.1.closedGapMm", "checklist.tally.0", "checklist.closing", "checklist.rodNutPressureBar", "checklist.stuffingBox"]));

    // A tally that does not match keeps the crankcase open: submission is refused.
    const draft = completeDraft(created.ctx, { inspectedOn: daysAgo(0), engineHours: created.sent.engineHours });
    draft.checklist.tally[1].countOut = 5;
    expect((await put(id, 1, draft)).status).toBe(200);
    const mismatch = await call("engineer", submitRoute, "POST", `/api/inspections/${id}/submit`, {}, id);
    expect(mismatch.status).toBe(400);
    expect(mismatch.body.error).toMatch(/6 taken in, 5 brought out/);

    draft.checklist.tally[1].countOut = 6;
    expect((await put(id, 2, draft)).status).toBe(200);
    as("engineer");
    const [a, b] = await Promise.all([
      submitRoute(request("POST", `/api/inspections/${id}/submit`, {}), params(id)),
      submitRoute(request("POST", `/api/inspections/${id}/submit`, {}), params(id)),
    ]);
    expect([a.status, b.status]).toEqual([200, 200]);
    const results = [await a.json(), await b.json()];
    expect(results.filter((r) => r.alreadyDone)).toHaveLength(1);
    expect((await get(id)).state).toBe("submitted");
    expect(await db("audit_log").where({ entity_id: String(id), action: "inspection.submit" }).count({ n: "*" }).first()).toMatchObject({ n: 1 });
    // A submitted record is no longer a draft: saving it is refused with the server's copy.
    const late = await put(id, 4, draft);
    expect(late.status).toBe(409);
    expect(late.body.details.server.state).toBe("submitted");
  });

  it("refuses a submission that hides a plausibility warning until it is confirmed", async () => {
    const unitId = await freshUnit();
    const created = await createDraft(unitId);
    const id = created.body.id as number;
    const draft = completeDraft(created.ctx, { inspectedOn: daysAgo(0), engineHours: created.sent.engineHours });
    draft.readings[3].diameterMm = 599.7; // 0.3 mm under the 600 mm nominal bore: possible (gauge setting?), so a warning
    expect((await put(id, 1, draft)).status).toBe(200);
    const res = await call("engineer", submitRoute, "POST", `/api/inspections/${id}/submit`, {}, id);
    expect(res.status).toBe(400);
    expect(res.body.error).toMatch(/confirm or correct the warning \(599\.70 mm \(599\.6\d mm at 20 °C\)/);
    draft.readings[3].warningConfirmed = "Checked: reading is as taken.";
    expect((await put(id, 2, draft)).status).toBe(200);
    expect((await call("engineer", submitRoute, "POST", `/api/inspections/${id}/submit`, {}, id)).status).toBe(200);
  });

  it("refuses to submit a reading that cannot be physically true, even when it is marked confirmed", async () => {
    const unitId = await freshUnit();
    const created = await createDraft(unitId);
    const id = created.body.id as number;
    const draft = completeDraft(created.ctx, { inspectedOn: daysAgo(0), engineHours: created.sent.engineHours });
    draft.readings[3].diameterMm = 60.04; // 600.04 with a digit dropped
    draft.readings[3].warningConfirmed = "the reading is right";
    // The draft keeps what was typed...
    expect((await put(id, 1, draft)).status).toBe(200);
    // ...but the server will not take it into a record.
    const res = await call("engineer", submitRoute, "POST", `/api/inspections/${id}/submit`, { revision: 2 }, id);
    expect(res.status).toBe(400);
    expect(res.body.details.field).toBe("readings.s2|ath");
    expect(res.body.error).toMatch(/60\.04 mm .*is about a tenth of the 600\.00 mm bore/);
    expect((await get(id)).state).toBe("draft");
  });

  it("refuses to submit a ring gap beyond five times its limit, or a gap with no place of measurement", async () => {
    const unitId = await freshUnit();
    const created = await createDraft(unitId);
    const id = created.body.id as number;
    const draft = completeDraft(created.ctx, { inspectedOn: daysAgo(0), engineHours: created.sent.engineHours });
    const limit = created.ctx.profile.rings[0].gapLimitMm;
    draft.rings[0].closedGapMm = Math.round(limit * 5.5 * 100) / 100;
    expect((await put(id, 1, draft)).status).toBe(200);
    let res = await call("engineer", submitRoute, "POST", `/api/inspections/${id}/submit`, {}, id);
    expect(res.status).toBe(400);
    expect(res.body.details.problems.map((p: { field: string }) => p.field)).toEqual([`rings.${draft.rings[0].position}`]);
    draft.rings[0].closedGapMm = created.ctx.profile.rings[0].gapNewMaxMm;
    draft.rings[0].gapMeasuredIn = null;
    expect((await put(id, 2, draft)).status).toBe(200);
    expect((await get(id)).draft.rings[0].gapMeasuredIn).toBeNull(); // a skipped answer stays unanswered
    res = await call("engineer", submitRoute, "POST", `/api/inspections/${id}/submit`, {}, id);
    expect(res.status).toBe(400);
    expect(res.body.details.problems.map((p: { field: string }) => p.field)).toEqual([`rings.${draft.rings[0].position}.gapMeasuredIn`]);
  });

  it("refuses to submit a rod nut pressure beyond the profile's tolerance", async () => {
    await db("engine_profiles").where({ id: world.profileId }).update({ rod_nut_pressure_bar: 1250 }); // invented test figure
    const unitId = await freshUnit();
    const created = await createDraft(unitId);
    const id = created.body.id as number;
    const draft = completeDraft(created.ctx, { inspectedOn: daysAgo(0), engineHours: created.sent.engineHours });
    const figure = created.ctx.profile.rodNutPressureBar!;
    draft.checklist.rodNutPressureBar = Math.round(figure * 0.85); // −15 %
    expect((await put(id, 1, draft)).status).toBe(200);
    const res = await call("engineer", submitRoute, "POST", `/api/inspections/${id}/submit`, {}, id);
    expect(res.status).toBe(400);
    expect(res.body.details.field).toBe("checklist.rodNutPressureBar");
    draft.checklist.rodNutPressureBar = Math.round(figure * 0.95); // −5 %: a caution, not a block
    expect((await put(id, 2, draft)).status).toBe(200);
    expect((await call("engineer", submitRoute, "POST", `/api/inspections/${id}/submit`, {}, id)).status).toBe(200);
  });

  it("answers a submit naming a stale revision with a conflict and the server's copy", async () => {
    const unitId = await freshUnit();
    const created = await createDraft(unitId);
    const id = created.body.id as number;
    const draft = completeDraft(created.ctx, { inspectedOn: daysAgo(0), engineHours: created.sent.engineHours });
    expect((await put(id, 1, draft)).status).toBe(200); // this device saved revision 2
    const other = structuredClone(draft);
    other.header.crew = "saved on another device";
    expect((await put(id, 2, other)).status).toBe(200); // another device: revision 3
    const res = await call("engineer", submitRoute, "POST", `/api/inspections/${id}/submit`, { revision: 2 }, id);
    expect(res.status).toBe(409);
    expect(res.body.details.server.draft.header.crew).toBe("saved on another device");
    expect((await get(id)).state).toBe("draft");
  });

  it("lets only the vessel's chief engineer approve, recomputes the unit's analysis, and never edits the approved row", async () => {
    const unitId = await freshUnit();
    const { id, draft } = await submitted(unitId, 0.62);
    expect((await call("engineer", approveRoute, "POST", `/api/inspections/${id}/approve`, {}, id)).status).toBe(403);
    expect((await call("chief2", approveRoute, "POST", `/api/inspections/${id}/approve`, {}, id)).status).toBe(404);
    const ok = await call("chief", approveRoute, "POST", `/api/inspections/${id}/approve`, {}, id);
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    const again = await call("chief", approveRoute, "POST", `/api/inspections/${id}/approve`, {}, id);
    expect(again.body.alreadyDone).toBe(true);
    const row = await db("inspections").where({ id }).first("state", "approved_by", "approved_at");
    expect(row).toMatchObject({ state: "approved", approved_by: world.users.chief.id });
    const analysis = await db("unit_analysis").where({ unit_id: unitId }).first("last_inspected_on", "max_wear_mm");
    expect(analysis.last_inspected_on).toBe(daysAgo(0));
    expect(Number(analysis.max_wear_mm)).toBeGreaterThan(0.5);
    const put2 = await put(id, 99, draft);
    expect(put2.status).toBe(409);
    expect((await get(id)).state).toBe("approved");
  });

  it("returns a submitted record with the chief's comment; the engineer corrects and submits again", async () => {
    const unitId = await freshUnit();
    const { id, draft } = await submitted(unitId);
    expect((await call("chief", returnRoute, "POST", `/api/inspections/${id}/return`, { comment: "" }, id)).status).toBe(400);
    const ret = await call("chief", returnRoute, "POST", `/api/inspections/${id}/return`, { comment: "Station s3 looks high: gauge it again." }, id);
    expect(ret.status).toBe(200);
    const back = await get(id);
    expect(back).toMatchObject({ state: "returned", returnComment: "Station s3 looks high: gauge it again." });
    draft.readings[4].diameterMm -= 0.01;
    expect((await put(id, back.revision, draft)).status).toBe(200);
    expect((await call("engineer", submitRoute, "POST", `/api/inspections/${id}/submit`, {}, id)).status).toBe(200);
    const actions = (await db("audit_log").where({ entity_id: String(id) }).orderBy("id").select("action")).map((r) => r.action);
    expect(actions).toEqual(["inspection.create", "inspection.submit", "inspection.return", "inspection.submit"]);
  });
});

describe("amending an approved inspection", () => {
  it("opens a new version with a reason, keeps the original until the amendment is approved, then supersedes it", async () => {
    const unitId = await freshUnit();
    const { id: original } = await submitted(unitId, 0.5);
    expect((await call("chief", approveRoute, "POST", `/api/inspections/${original}/approve`, {}, original)).status).toBe(200);

    expect((await call("engineer", amendRoute, "POST", `/api/inspections/${original}/amend`, { reason: "Typing error at s3", clientToken: randomToken(24) }, original)).status).toBe(403);
    expect((await call("chief", amendRoute, "POST", `/api/inspections/${original}/amend`, { reason: "no", clientToken: randomToken(24) }, original)).status).toBe(400);
    const token = randomToken(24);
    const amend = await call("chief", amendRoute, "POST", `/api/inspections/${original}/amend`, { reason: "Typing error at s3 fore-aft", clientToken: token }, original);
    expect(amend.status).toBe(201);
    const amendId = amend.body.id as number;
    // The same request again, or a second amendment while one is open, gives the same draft.
    expect((await call("chief", amendRoute, "POST", `/api/inspections/${original}/amend`, { reason: "Typing error at s3 fore-aft", clientToken: token }, original)).body.id).toBe(amendId);
    expect((await call("chief", amendRoute, "POST", `/api/inspections/${original}/amend`, { reason: "Another reason", clientToken: randomToken(24) }, original)).body.id).toBe(amendId);

    const copy = await get(amendId);
    const orig = await get(original);
    expect(copy).toMatchObject({ state: "draft", version: 2, supersedesId: original, amendmentReason: "Typing error at s3 fore-aft" });
    expect(copy.draft.readings).toEqual(orig.draft.readings);
    expect(orig.state).toBe("approved");
    expect(orig.supersededById).toBe(amendId);

    const corrected = structuredClone(copy.draft);
    const s3 = corrected.readings.findIndex((r) => r.stationKey === "s3" && r.axisKey === "fa");
    corrected.readings[s3].diameterMm = 600.1;
    expect((await put(amendId, copy.revision, corrected, "engineer")).status).toBe(200);
    expect((await call("engineer", submitRoute, "POST", `/api/inspections/${amendId}/submit`, {}, amendId)).status).toBe(200);
    expect((await get(original)).state).toBe("approved"); // still the record until the amendment is approved
    // The chief opened the amendment, so a second person approves it.
    expect((await call("chief", approveRoute, "POST", `/api/inspections/${amendId}/approve`, {}, amendId)).status).toBe(403);
    expect((await call("supt", approveRoute, "POST", `/api/inspections/${amendId}/approve`, {}, amendId)).status).toBe(200);

    const [o, n] = [await get(original), await get(amendId)];
    expect(o.state).toBe("superseded");
    expect(o.draft.readings).toEqual(orig.draft.readings); // kept unchanged, still visible
    expect(n.state).toBe("approved");
    const approvedRows = await db("inspections").where({ unit_id: unitId, state: "approved" }).select("id");
    expect(approvedRows.map((r) => r.id)).toEqual([amendId]);
    const trail = (await db("audit_log").whereIn("entity_id", [String(original), String(amendId)]).orderBy("id").select("action", "entity_id")).map((r) => `${r.entity_id === String(original) ? "v1" : "v2"} ${r.action}`);
    expect(trail).toEqual([
      "v1 inspection.create",
      "v1 inspection.submit",
      "v1 inspection.approve",
      "v2 inspection.amend",
      "v1 inspection.amendment_opened",
      "v2 inspection.submit",
      "v1 inspection.superseded",
      "v2 inspection.approve",
    ]);
    // A superseded record cannot be amended again; only the current version can.
    expect((await call("chief", amendRoute, "POST", `/api/inspections/${original}/amend`, { reason: "Second thoughts", clientToken: randomToken(24) }, original)).status).toBe(409);
  });
});

describe("reading", () => {
  it("shows an inspection to its vessel's crew and the superintendent, and to no one else", async () => {
    const unitId = await freshUnit();
    const created = await createDraft(unitId);
    const id = created.body.id as number;
    expect((await call("supt", getRoute, "GET", `/api/inspections/${id}`, undefined, id)).status).toBe(200);
    expect((await call("engineer2", getRoute, "GET", `/api/inspections/${id}`, undefined, id)).status).toBe(404);
    expect((await call("engineer", getRoute, "GET", `/api/inspections/999999`, undefined, 999999)).status).toBe(404);
  });
});

describe("a closed gap measured in a worn part of the liner", () => {
  it("keeps the liner diameter there and judges the gap as in a gauge ring (gap − π × diameter increase)", async () => {
    // [derived] a ring in a bore Δd larger opens by π·Δd, so the gauge-ring gap is the reading less π·Δd.
    const unitId = await freshUnit();
    const created = await createDraft(unitId);
    const id = created.body.id as number;
    const draft = completeDraft(created.ctx, { inspectedOn: daysAgo(0), engineHours: created.sent.engineHours, wearMm: 0.4 });
    const spec = created.ctx.profile.rings[0];
    // Read 1.2 mm over the limit in a part of the liner worn 0.5 mm: in a gauge ring it is 1.2 − π·0.5 ≈ −0.37 mm from the limit.
    const bore = created.ctx.profile.boreMm;
    draft.rings[0] = { ...draft.rings[0], closedGapMm: spec.gapLimitMm + 1.2, gapMeasuredIn: "liner_worn", gapLinerDiameterMm: bore + 0.5 };
    expect((await put(id, 1, draft)).status).toBe(200);
    const saved = await get(id);
    expect(saved.draft.rings[0]).toMatchObject({ gapMeasuredIn: "liner_worn", gapLinerDiameterMm: bore + 0.5 });
    expect((await call("engineer", submitRoute, "POST", `/api/inspections/${id}/submit`, {}, id)).status).toBe(200);
    expect((await call("chief", approveRoute, "POST", `/api/inspections/${id}/approve`, {}, id)).status).toBe(200);
    const row = await db("unit_analysis").where({ unit_id: unitId }).first("summary");
    const summary = typeof row.summary === "string" ? JSON.parse(row.summary) : row.summary;
    const top = summary.rings.find((r: { position: number }) => r.position === spec.position);
    // The liner diameter there is referred to 20 °C like the readings (gauge 24 °C, liner 31 °C here).
    const increase = correctTo20C(bore + 0.5, created.ctx.profile.alphaGaugePerK, 24, created.ctx.profile.alphaLinerPerK, 31) - bore;
    expect(top.gapMm).toBeCloseTo(spec.gapLimitMm + 1.2 - Math.PI * increase, 2);
    expect(top.overLimit).toBe(false);

    // An amendment starts from the whole record, the liner diameter at the gap included.
    const amend = await call("chief", amendRoute, "POST", `/api/inspections/${id}/amend`, { reason: "Recheck the top ring gap", clientToken: randomToken(24) }, id);
    expect(amend.status).toBe(201);
    const amended = await get(amend.body.id as number);
    expect(amended.draft.rings[0]).toMatchObject({ gapMeasuredIn: "liner_worn", gapLinerDiameterMm: bore + 0.5 });
  });
});
