import { randomUUID } from "node:crypto";
import { hashPassword } from "better-auth/crypto";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { POST as approveRoute } from "@/app/api/inspections/[inspectionId]/approve/route";
import type { CurrentUser } from "@/lib/auth/session";
import { db } from "@/lib/db/knex";
import { listAwaitingApproval, listAwaitingSomeoneElse, listAwaitingSuperintendent } from "@/lib/home/queries";
import { randomToken } from "@/lib/inspections/form";
import { amendInspection, saveDraft, submitInspection } from "@/lib/inspections/mutations";
import { approvedOn, draftOn } from "../support/inspection-builders";
import { request } from "../support/matrix";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld, type WorldUser } from "../support/role-world";
import { signInCookie } from "../support/sessions";

/*
 * A record the class surveyor relies on is approved by a second person: whoever entered
 * (created, or opened the amendment) or submitted an inspection cannot approve it, a chief
 * engineer included; another chief engineer of the vessel or the superintendent does.
 * Every combination of who entered, who submitted and who approves, through the real
 * approve route and MariaDB.
 */
type Who = "engineer" | "chief" | "chiefB" | "supt" | "admin" | "chief2" | "engineer2";
let world: RoleWorld;
const people = {} as Record<Who, WorldUser>;
const cookies = {} as Record<Who, string>;
let units: number[] = [];

beforeAll(async () => {
  world = await buildRoleWorld(db, "appr");
  Object.assign(people, world.users);
  // A second chief engineer on vessel 1, for the "another chief of the vessel" cells.
  const id = randomUUID();
  const now = new Date();
  const email = `chief-b-${Date.now().toString(36)}@appr.test`;
  await db("user").insert({ id, name: "Bo Second Chief", email, emailVerified: true, role: "chief_engineer", banned: false, createdAt: now, updatedAt: now });
  await db("account").insert({ id: randomUUID(), accountId: id, providerId: "credential", userId: id, password: await hashPassword(WORLD_PASSWORD), createdAt: now, updatedAt: now });
  await db("user_vessels").insert({ user_id: id, vessel_id: world.vessel1 });
  people.chiefB = { id, email, name: "Bo Second Chief", role: "chief_engineer", vesselIds: [world.vessel1] };
  for (const w of Object.keys(people) as Who[]) cookies[w] = await signInCookie(people[w].email, WORLD_PASSWORD);
  const have = (await db("cylinder_units").where({ engine_id: world.engine1 }).max({ m: "cylinder_no" }).first())?.m ?? 0;
  await db("cylinder_units").insert(Array.from({ length: 40 }, (_, i) => ({ engine_id: world.engine1, cylinder_no: have + i + 1 })));
  units = (await db("cylinder_units").where({ engine_id: world.engine1 }).where("cylinder_no", ">", have).orderBy("cylinder_no").pluck("id"));
}, 120_000);

const actor = (w: Who) => ({ id: people[w].id, name: people[w].name });

/** A submitted record on a unit of its own: entered by `entered`, submitted by `submitted`. */
async function submittedRecord(entered: Who, submitted: Who): Promise<number> {
  const d = await draftOn(units.shift()!, actor(entered));
  await submitInspection(actor(submitted), d.id, d.revision);
  return d.id;
}

/** An amendment opened by `opened` of a record approved earlier, then submitted by `submitted`. */
async function submittedAmendment(opened: Who, submitted: Who): Promise<number> {
  const original = await approvedOn(units.shift()!, actor("engineer"), actor("chiefB"));
  const { id } = await amendInspection(actor(opened), original.id, "Typing error at station s3.", randomToken(24));
  const row = await db("inspections").where({ id }).first("revision");
  const saved = await saveDraft(actor(submitted), id, row.revision, original.draft);
  await submitInspection(actor(submitted), id, saved.revision);
  return id;
}

async function approveAs(who: Who, id: number) {
  asCaller(cookies[who]);
  const res = await approveRoute(request("POST", `/api/inspections/${id}/approve`, {}), { params: Promise.resolve({ inspectionId: String(id) }) } as never);
  return { status: res.status, body: (await res.json().catch(() => null)) as { error?: string } | null };
}

// [entered by, submitted by, approver, expected answer]
const CELLS: [Who, Who, Who, 200 | 403][] = [
  // the engineer gauged and submitted: any approver of the vessel but the engineer
  ["engineer", "engineer", "chief", 200],
  ["engineer", "engineer", "chiefB", 200],
  ["engineer", "engineer", "supt", 200],
  ["engineer", "engineer", "engineer", 403],
  ["engineer", "engineer", "admin", 403],
  ["engineer", "engineer", "chief2", 403], // chief of another vessel
  ["engineer", "engineer", "engineer2", 403],
  // the chief gauged and submitted himself
  ["chief", "chief", "chief", 403],
  ["chief", "chief", "chiefB", 200],
  ["chief", "chief", "supt", 200],
  ["chief", "chief", "chief2", 403],
  // the engineer gauged, the chief submitted
  ["engineer", "chief", "chief", 403],
  ["engineer", "chief", "chiefB", 200],
  ["engineer", "chief", "supt", 200],
  ["engineer", "chief", "engineer", 403],
  // the chief gauged, the engineer submitted
  ["chief", "engineer", "chief", 403],
  ["chief", "engineer", "chiefB", 200],
  ["chief", "engineer", "supt", 200],
  ["chief", "engineer", "engineer", 403],
];

describe("who may approve an inspection", () => {
  it.each(CELLS)("entered by %s, submitted by %s: %s approving answers %i", async (entered, submitted, approver, expected) => {
    const id = await submittedRecord(entered, submitted);
    const res = await approveAs(approver, id);
    // Crew of another vessel may also be told "not found" (not revealing the record exists).
    if (approver === "chief2" || approver === "engineer2") expect([403, 404], JSON.stringify(res.body)).toContain(res.status);
    else expect(res.status, JSON.stringify(res.body)).toBe(expected);
    const row = await db("inspections").where({ id }).first("state", "approved_by");
    if (expected === 200) expect(row).toMatchObject({ state: "approved", approved_by: people[approver].id });
    else expect(row).toMatchObject({ state: "submitted", approved_by: null });
  });

  it("tells a chief engineer why he may not approve his own record, and who will", async () => {
    const id = await submittedRecord("chief", "chief");
    const res = await approveAs("chief", id);
    expect(res.status).toBe(403);
    expect(res.body?.error).toMatch(/You entered this record.*another chief engineer of the vessel or the superintendent/i);
  });

  it.each([
    ["chief", "engineer", "chief", 403],
    ["chief", "engineer", "supt", 200],
    ["chief", "engineer", "chiefB", 200],
    ["chiefB", "chief", "chief", 403], // submitted the amendment
  ] as [Who, Who, Who, number][])("an amendment opened by %s and submitted by %s: %s approving answers %i", async (opened, submitted, approver, expected) => {
    const id = await submittedAmendment(opened, submitted);
    expect((await approveAs(approver, id)).status).toBe(expected);
  });
});

describe("the queues on the home screens", () => {
  const asUser = (w: Who): CurrentUser => ({ ...people[w], vessels: people[w].vesselIds });

  it("the chief's queue leaves out his own records and lists them as waiting for someone else; the superintendent's lists them once no other chief may approve", async () => {
    const own = await submittedRecord("chief", "chief");
    const crew = await submittedRecord("engineer", "engineer");
    const ids = (rows: { id: number }[]) => rows.map((r) => r.id);

    expect(ids(await listAwaitingApproval(asUser("chief")))).toContain(crew);
    expect(ids(await listAwaitingApproval(asUser("chief")))).not.toContain(own);
    expect(ids(await listAwaitingSomeoneElse(asUser("chief")))).toContain(own);
    expect(ids(await listAwaitingSomeoneElse(asUser("chief")))).not.toContain(crew);
    expect(ids(await listAwaitingApproval(asUser("chiefB")))).toEqual(expect.arrayContaining([own, crew]));

    // With a second chief on board, the record waits for him, not for the superintendent.
    expect(ids(await listAwaitingSuperintendent(asUser("supt")))).not.toContain(own);
    // With no other chief on the vessel (and a deactivated one does not count), it is the superintendent's.
    await db("user").where({ id: people.chiefB.id }).update({ banned: true });
    try {
      const queue = ids(await listAwaitingSuperintendent(asUser("supt")));
      expect(queue).toContain(own);
      expect(queue).not.toContain(crew);
    } finally {
      await db("user").where({ id: people.chiefB.id }).update({ banned: false });
    }
  });
});
