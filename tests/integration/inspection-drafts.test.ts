import { HeadObjectCommand } from "@aws-sdk/client-s3";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { POST as createRoute } from "@/app/api/inspections/route";
import { DELETE as discardRoute } from "@/app/api/inspections/[inspectionId]/route";
import { POST as returnRoute } from "@/app/api/inspections/[inspectionId]/return/route";
import { db } from "@/lib/db/knex";
import { randomToken } from "@/lib/inspections/form";
import { amendInspection, submitInspection } from "@/lib/inspections/mutations";
import { bucket, s3 } from "@/lib/storage/s3";
import { approvedOn, daysAgo, draftOn, photoOn, readyUnit } from "../support/inspection-builders";
import { request } from "../support/matrix";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { signInCookie } from "../support/sessions";

/*
 * Drafts opened by mistake or twice, against the real MariaDB and the S3 fake: a unit holds
 * one open draft however the second request arrives (the same device twice, two devices at
 * once), and the author can discard a draft, which removes its rows and its photos' objects
 * and leaves an audit entry.
 */

let world: RoleWorld;
const cookie: Record<string, string> = {};
let units: number[] = [];
let nextUnit = 0;

beforeAll(async () => {
  world = await buildRoleWorld(db, "drafts");
  for (const k of ["engineer", "chief", "engineer2"] as const) cookie[k] = await signInCookie(world.users[k].email, WORLD_PASSWORD);
  const have = await db("cylinder_units").where({ engine_id: world.engine1 }).count({ n: "*" }).first();
  if (Number(have?.n ?? 0) < 30) {
    const maxNo = (await db("cylinder_units").where({ engine_id: world.engine1 }).max({ m: "cylinder_no" }).first())?.m ?? 0;
    await db("cylinder_units").insert(Array.from({ length: 30 - Number(have?.n ?? 0) }, (_, i) => ({ engine_id: world.engine1, cylinder_no: maxNo + i + 1 })));
  }
  units = (await db("cylinder_units").where({ engine_id: world.engine1 }).orderBy("cylinder_no").select("id")).map((r) => r.id);
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

type Who = "engineer" | "chief" | "engineer2";
const actor = (who: Who) => ({ id: world.users[who].id, name: world.users[who].name });
const params = (id: number) => ({ params: Promise.resolve({ inspectionId: String(id) }) }) as never;

async function createBody(unitId: number) {
  const ctx = await readyUnit(unitId);
  const engineHours = Math.max(39_000, ctx.previous?.engineHours ?? 0);
  return {
    unitId,
    clientToken: randomToken(24),
    inspectedOn: daysAgo(0),
    engineHours,
    linerHours: engineHours - ctx.liner.installedEngineHours + ctx.liner.linerHoursAtInstall,
    linerHoursReason: null,
    crew: "3/E",
    gaugeTempC: 24,
    linerTempC: 31,
  };
}

async function create(who: Who, body: unknown) {
  asCaller(cookie[who]);
  const res = await createRoute(request("POST", "/api/inspections", body));
  return { status: res.status, body: await res.json() };
}

async function discard(who: Who, id: number) {
  asCaller(cookie[who]);
  const res = await discardRoute(request("DELETE", `/api/inspections/${id}`), params(id));
  return { status: res.status, body: await res.json().catch(() => null) };
}

const openDrafts = (unitId: number) => db("inspections").where({ unit_id: unitId }).whereIn("state", ["draft", "returned"]).whereNull("supersedes_id").select("id");

async function exists(key: string): Promise<boolean> {
  try {
    await s3.send(new HeadObjectCommand({ Bucket: bucket, Key: key }));
    return true;
  } catch {
    return false;
  }
}

describe("one open draft per unit", () => {
  it("answers a second request for a new inspection with the unit's open draft, not a second one", async () => {
    const unitId = await freshUnit();
    const first = await create("engineer", await createBody(unitId));
    expect(first.status).toBe(201);
    // Another device (another token), even another person of the vessel's crew: the same draft.
    const second = await create("chief", await createBody(unitId));
    expect(second.status).toBe(200);
    expect(second.body).toMatchObject({ id: first.body.id, created: false, existing: true });
    expect(await openDrafts(unitId)).toHaveLength(1);
  });

  it("makes one draft when two devices ask at the same moment", async () => {
    const unitId = await freshUnit();
    const [a, b] = [await createBody(unitId), await createBody(unitId)];
    asCaller(cookie.engineer);
    const answers = await Promise.all([createRoute(request("POST", "/api/inspections", a)), createRoute(request("POST", "/api/inspections", b))]);
    const bodies = await Promise.all(answers.map((r) => r.json()));
    expect(answers.map((r) => r.status).sort()).toEqual([200, 201]);
    expect(bodies[0].id).toBe(bodies[1].id);
    expect(await openDrafts(unitId)).toHaveLength(1);
  });

  it("opens the record returned for correction rather than a new draft beside it", async () => {
    const unitId = await freshUnit();
    const d = await draftOn(unitId, actor("engineer"));
    await submitInspection(actor("engineer"), d.id, d.revision);
    asCaller(cookie.chief);
    expect((await returnRoute(request("POST", `/api/inspections/${d.id}/return`, { comment: "Re-gauge station 2." }), params(d.id))).status).toBe(200);
    const again = await create("engineer", await createBody(unitId));
    expect(again.body).toMatchObject({ id: d.id, existing: true });
  });

  it("still opens a new draft once the last one is submitted, and an amendment does not count as the unit's draft", async () => {
    const unitId = await freshUnit();
    const a = await approvedOn(unitId, actor("engineer"), actor("chief"));
    const amendment = await amendInspection(actor("chief"), a.id, "Typing error at station 3.", randomToken(24));
    expect(amendment.created).toBe(true);
    const fresh = await create("engineer", await createBody(unitId));
    expect(fresh.status).toBe(201);
    expect(fresh.body.id).not.toBe(amendment.id);
  });
});

describe("discarding a draft", () => {
  it("removes the draft, its readings and its photos' objects, and audits what was discarded", async () => {
    const unitId = await freshUnit();
    const d = await draftOn(unitId, actor("engineer"));
    const photo = await photoOn(d.id, actor("engineer"));
    const files = await db("inspection_photos as p")
      .join("stored_files as f", "f.id", "p.file_id")
      .leftJoin("stored_files as t", "t.id", "p.thumbnail_file_id")
      .where("p.id", photo.id)
      .first("f.id as fileId", "f.object_key as key", "t.object_key as thumbKey");
    expect(await exists(files.key)).toBe(true);
    const readings = await db("liner_readings").where({ inspection_id: d.id }).count({ n: "*" }).first();
    expect(Number(readings?.n)).toBeGreaterThan(0);

    const res = await discard("engineer", d.id);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(await db("inspections").where({ id: d.id }).first("id")).toBeUndefined();
    expect(await db("liner_readings").where({ inspection_id: d.id }).first("id")).toBeUndefined();
    expect(await db("ring_readings").where({ inspection_id: d.id }).first("id")).toBeUndefined();
    expect(await db("inspection_photos").where({ inspection_id: d.id }).first("id")).toBeUndefined();
    expect((await db("stored_files").where({ id: files.fileId }).first("status")).status).toBe("deleted");
    expect(await exists(files.key)).toBe(false);
    if (files.thumbKey) expect(await exists(files.thumbKey)).toBe(false);

    const audit = await db("audit_log").where({ entity_type: "inspection", entity_id: String(d.id), action: "inspection.discard" }).select("actor_id", "vessel_id", "detail");
    expect(audit).toHaveLength(1);
    const detail = typeof audit[0].detail === "string" ? JSON.parse(audit[0].detail) : audit[0].detail;
    expect(audit[0]).toMatchObject({ actor_id: world.users.engineer.id, vessel_id: world.vessel1 });
    expect(detail).toMatchObject({ unitId, photos: 1, readings: Number(readings?.n) });

    // The unit is free again: the next request opens a new draft.
    expect((await create("engineer", await createBody(unitId))).status).toBe(201);
  });

  it("is the author's alone, and only while the record is a draft", async () => {
    const unitId = await freshUnit();
    const d = await draftOn(unitId, actor("engineer"));
    const chief = await discard("chief", d.id);
    expect(chief.status).toBe(403);
    expect(chief.body.error).toMatch(/Only the person who opened this draft/);
    // Crew of another vessel get the same 404 as for a draft that does not exist.
    expect((await discard("engineer2", d.id)).status).toBe(404);
    await submitInspection(actor("engineer"), d.id, d.revision);
    const submitted = await discard("engineer", d.id);
    expect(submitted.status).toBe(409);
    expect(await db("inspections").where({ id: d.id }).first("state")).toMatchObject({ state: "submitted" });
    expect(await db("audit_log").where({ entity_id: String(d.id), action: "inspection.discard" }).first("id")).toBeUndefined();
  });

  it("keeps the photos an amendment shares with the approved record it amends", async () => {
    const unitId = await freshUnit();
    const d = await draftOn(unitId, actor("engineer"));
    const photo = await photoOn(d.id, actor("engineer"));
    const key = (await db("inspection_photos as p").join("stored_files as f", "f.id", "p.file_id").where("p.id", photo.id).first("f.object_key as key")).key as string;
    const { approveInspection } = await import("@/lib/inspections/mutations");
    await submitInspection(actor("engineer"), d.id, d.revision);
    await approveInspection(actor("chief"), d.id);
    const amendment = await amendInspection(actor("chief"), d.id, "Wrong caption on the photo.", randomToken(24));
    const res = await discard("chief", amendment.id);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.deletedObjects).toBe(0);
    expect(await exists(key)).toBe(true);
    expect(await db("inspection_photos").where({ inspection_id: d.id }).count({ n: "*" }).first()).toMatchObject({ n: 1 });
  });
});
