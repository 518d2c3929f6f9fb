import { beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { GET as engineAnalysisRoute } from "@/app/api/engines/[engineId]/analysis/route";
import { POST as createRoute } from "@/app/api/inspections/route";
import { GET as getRoute, PUT as putRoute } from "@/app/api/inspections/[inspectionId]/route";
import { POST as approveRoute } from "@/app/api/inspections/[inspectionId]/approve/route";
import { GET as unitAnalysisRoute } from "@/app/api/units/[unitId]/analysis/route";
import { GET as vesselRoute } from "@/app/api/vessels/[vesselId]/route";
import { MAX_BODY_BYTES } from "@/lib/auth/api";
import { db } from "@/lib/db/knex";
import { draftOn, submittedOn } from "../support/inspection-builders";
import { APP, request } from "../support/matrix";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { signInCookie } from "../support/sessions";

/*
 * The checks every state-changing API request passes in the route wrapper, against the
 * real route handlers and MariaDB: a foreign or missing Origin is refused (403), a body
 * that is not JSON (415), a body over the cap (413), and nothing is changed by any of them.
 * Then the one 404 for ids that are malformed, missing, or on another vessel.
 */

let world: RoleWorld;
let engineerCookie = "";
let chiefCookie = "";
let unitId = 0;
const engineer = () => ({ id: world.users.engineer.id, name: world.users.engineer.name });

beforeAll(async () => {
  world = await buildRoleWorld(db, "guard");
  engineerCookie = await signInCookie(world.users.engineer.email, WORLD_PASSWORD);
  chiefCookie = await signInCookie(world.users.chief.email, WORLD_PASSWORD);
  const units = await db("cylinder_units").where({ engine_id: world.engine1 }).orderBy("cylinder_no").select("id");
  unitId = units[units.length - 1].id;
}, 60_000);

const params = (id: number | string) => ({ params: Promise.resolve({ inspectionId: String(id) }) }) as never;

/** A raw request: headers exactly as given (plus the caller's cookie), body as given. */
function raw(method: string, path: string, headers: Record<string, string>, body?: BodyInit) {
  const h = new Headers(headers);
  const cookie = mockedHeaders().get("cookie");
  if (cookie) h.set("cookie", cookie);
  return new Request(new URL(path, APP), { method, headers: h, body });
}

async function revisionOf(id: number) {
  return (await db("inspections").where({ id }).first("revision")).revision as number;
}

describe("state-changing requests", () => {
  it("saves a draft sent from the app's origin as JSON (the baseline the refusals below differ from)", async () => {
    const d = await draftOn(unitId, engineer());
    asCaller(engineerCookie);
    const res = await putRoute(request("PUT", `/api/inspections/${d.id}`, { revision: d.revision, draft: d.draft }), params(d.id));
    expect(res.status, await res.clone().text()).toBe(200);
  });

  it("refuses a foreign Origin and a missing Origin with 403, and changes nothing", async () => {
    const d = await draftOn(unitId, engineer());
    asCaller(engineerCookie);
    const body = JSON.stringify({ revision: d.revision, draft: d.draft });
    const foreign = await putRoute(raw("PUT", `/api/inspections/${d.id}`, { origin: "http://evil.example", "content-type": "application/json" }, body), params(d.id));
    expect(foreign.status).toBe(403);
    expect((await foreign.json()).error).toMatch(/did not come from a Kalibore page/);
    const missing = await putRoute(raw("PUT", `/api/inspections/${d.id}`, { "content-type": "application/json" }, body), params(d.id));
    expect(missing.status).toBe(403);
    // A look-alike: the same host name under another scheme or port is another origin.
    const lookalike = await putRoute(raw("PUT", `/api/inspections/${d.id}`, { origin: APP.replace(/:\d+$/, ":1"), "content-type": "application/json" }, body), params(d.id));
    expect(lookalike.status).toBe(403);
    expect(await revisionOf(d.id)).toBe(d.revision);
  });

  it("refuses an approval posted from another site, before it is approved", async () => {
    const s = await submittedOn(unitId, engineer());
    asCaller(chiefCookie);
    const res = await approveRoute(raw("POST", `/api/inspections/${s.id}/approve`, { origin: "http://evil.example" }), params(s.id));
    expect(res.status).toBe(403);
    expect((await db("inspections").where({ id: s.id }).first("state")).state).toBe("submitted");
  });

  it("refuses a JSON body sent as text/plain or as a form with 415", async () => {
    const d = await draftOn(unitId, engineer());
    asCaller(engineerCookie);
    const body = JSON.stringify({ revision: d.revision, draft: d.draft });
    for (const type of ["text/plain", "text/plain;charset=UTF-8", "application/x-www-form-urlencoded", "multipart/form-data; boundary=x"]) {
      const res = await putRoute(raw("PUT", `/api/inspections/${d.id}`, { origin: new URL(APP).origin, "content-type": type }, body), params(d.id));
      expect(res.status, type).toBe(415);
    }
    const untyped = await putRoute(raw("PUT", `/api/inspections/${d.id}`, { origin: new URL(APP).origin }, new Blob([body])), params(d.id));
    expect(untyped.status).toBe(415);
    expect(await revisionOf(d.id)).toBe(d.revision);
  });

  it("refuses a body over the cap with 413, whether or not it declares its length", async () => {
    const d = await draftOn(unitId, engineer());
    asCaller(engineerCookie);
    const huge = JSON.stringify({ revision: d.revision, draft: { ...d.draft, header: { ...d.draft.header, notes: "x".repeat(5 * 1024 * 1024) } } });
    const declared = await putRoute(
      raw("PUT", `/api/inspections/${d.id}`, { origin: new URL(APP).origin, "content-type": "application/json", "content-length": String(huge.length) }, huge),
      params(d.id),
    );
    expect(declared.status).toBe(413);
    // Streamed with no length: refused once the cap is passed, not after reading 5 MB.
    const stream = new ReadableStream({
      start(c) {
        for (let i = 0; i < 80; i++) c.enqueue(new TextEncoder().encode("x".repeat(64 * 1024)));
        c.close();
      },
    });
    const streamed = await putRoute(
      new Request(new URL(`/api/inspections/${d.id}`, APP), {
        method: "PUT",
        headers: { origin: new URL(APP).origin, "content-type": "application/json", cookie: engineerCookie },
        body: stream,
        duplex: "half",
      } as RequestInit),
      params(d.id),
    );
    expect(streamed.status).toBe(413);
    // Just under the cap is not refused for its size (it is parsed and answered on its merits).
    const near = JSON.stringify({ revision: d.revision, draft: d.draft }).padEnd(MAX_BODY_BYTES - 10, " ");
    const ok = await putRoute(raw("PUT", `/api/inspections/${d.id}`, { origin: new URL(APP).origin, "content-type": "application/json" }, near), params(d.id));
    expect(ok.status).toBe(200);
  });

  it("a refused create leaves no draft behind", async () => {
    asCaller(engineerCookie);
    const before = (await db("inspections").where({ unit_id: unitId }).count({ n: "*" }).first())!.n;
    const res = await createRoute(raw("POST", "/api/inspections", { origin: "http://evil.example", "content-type": "application/json" }, JSON.stringify({ unitId })), { params: Promise.resolve({}) } as never);
    expect(res.status).toBe(403);
    expect((await db("inspections").where({ unit_id: unitId }).count({ n: "*" }).first())!.n).toBe(before);
  });
});

describe("not found: one answer for malformed, missing and not yours", () => {
  it("answers 404 for malformed ids without touching the database", async () => {
    asCaller(engineerCookie);
    for (const bad of ["abc", "1e309", "1e3", "-1", "0", "1.5", "007", "99999999999", " 1"]) {
      const res = await getRoute(request("GET", `/api/inspections/${encodeURIComponent(bad)}`), params(bad));
      expect(res.status, bad).toBe(404);
    }
  });

  it("answers the same 404 for a missing inspection and one on another vessel", async () => {
    const d = await draftOn(unitId, engineer());
    const missingId = (await db("inspections").max({ m: "id" }).first())!.m + 1000;
    asCaller(await signInCookie(world.users.engineer2.email, WORLD_PASSWORD));
    const foreign = await getRoute(request("GET", `/api/inspections/${d.id}`), params(d.id));
    const missing = await getRoute(request("GET", `/api/inspections/${missingId}`), params(missingId));
    expect(foreign.status).toBe(404);
    expect(missing.status).toBe(404);
    expect(await foreign.json()).toEqual(await missing.json());
  });

  it("the vessel, engine and unit routes answer 404 alike for malformed, missing and foreign ids", async () => {
    asCaller(await signInCookie(world.users.engineer2.email, WORLD_PASSWORD));
    const cases: [(req: Request, ctx: never) => Promise<Response>, string, number][] = [
      [vesselRoute, "vesselId", world.vessel1],
      [engineAnalysisRoute, "engineId", world.engine1],
      [unitAnalysisRoute, "unitId", unitId],
    ];
    for (const [route, key, foreignId] of cases) {
      for (const id of ["abc", "1e309", String(foreignId), "4294967295"]) {
        const res = await route(request("GET", `/api/x/${id}`), { params: Promise.resolve({ [key]: id }) } as never);
        expect(res.status, `${key}=${id}`).toBe(404);
      }
    }
  });
});
