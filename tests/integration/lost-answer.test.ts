import { beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { GET as getRoute, PUT as putRoute } from "@/app/api/inspections/[inspectionId]/route";
import { db } from "@/lib/db/knex";
import { randomToken } from "@/lib/inspections/form";
import type { InspectionDto } from "@/lib/inspections/schemas";
import { draftOn } from "../support/inspection-builders";
import { request } from "../support/matrix";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { signInCookie } from "../support/sessions";

/*
 * The server's half of recognising a lost answer: each draft save carries the device's id
 * for it; the server keeps the last accepted one with the revision it made, and shows it
 * in the record and in the 409 copy, so the device can tell its own save from another's.
 */

let world: RoleWorld;
let cookie = "";
const params = (id: number) => ({ params: Promise.resolve({ inspectionId: String(id) }) }) as never;

beforeAll(async () => {
  world = await buildRoleWorld(db, "lost");
  cookie = await signInCookie(world.users.engineer.email, WORLD_PASSWORD);
}, 60_000);

describe("a draft save's id", () => {
  it("is kept with the revision it made and named in the 409 a stale save gets", async () => {
    const unit = (await db("cylinder_units").where({ engine_id: world.engine1 }).orderBy("cylinder_no").first("id")).id;
    const d = await draftOn(unit, { id: world.users.engineer.id, name: world.users.engineer.name });
    asCaller(cookie);
    const lost = randomToken(24);
    const first = await putRoute(request("PUT", `/api/inspections/${d.id}`, { revision: d.revision, draft: d.draft, saveId: lost }), params(d.id));
    expect(first.status).toBe(200);
    const dto = (await (await getRoute(request("GET", `/api/inspections/${d.id}`), params(d.id))).json()) as InspectionDto;
    expect(dto).toMatchObject({ revision: d.revision + 1, lastSaveId: lost });

    // The device never heard the answer and saves again from the revision it had.
    const changed = structuredClone(d.draft);
    changed.header.crew = "typed after the answer was lost";
    const stale = await putRoute(request("PUT", `/api/inspections/${d.id}`, { revision: d.revision, draft: changed, saveId: randomToken(24) }), params(d.id));
    expect(stale.status).toBe(409);
    const server = ((await stale.json()) as { details: { server: InspectionDto } }).details.server;
    expect(server).toMatchObject({ revision: d.revision + 1, lastSaveId: lost });

    // A save id that is not one is refused in words.
    const bad = await putRoute(request("PUT", `/api/inspections/${d.id}`, { revision: server.revision, draft: changed, saveId: "x'; --" }), params(d.id));
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { error: string }).error).toMatch(/save id/);
  });
});
