import { db } from "@/lib/db/knex";
import { issueInvitation } from "@/lib/invitations/mutations";
import { mockedHeaders } from "./next-mocks";
import type { RoleWorld, WorldUser } from "./role-world";

/*
 * Building blocks for the authorization matrix (tests/integration/authorization-matrix.test.ts).
 * Each feature adds a file in tests/integration/matrix-cases/ exporting `routeCases` and/or
 * `actionCases`: one valid call per rule, aimed at vessel 1 of the role world when the rule
 * is vessel-scoped, so the crew of vessel 2 are "another vessel".
 */

export type Caller = { label: string; user: WorldUser | null };

export type RouteCall = { request: Request; params?: Record<string, string | string[]> };
export type RouteCase = (world: RoleWorld, caller: Caller) => Promise<RouteCall>;
export type ActionCase = (world: RoleWorld, caller: Caller) => Promise<Record<string, unknown>>;

export type MatrixCases = { routeCases?: Record<string, RouteCase>; actionCases?: Record<string, ActionCase> };

export const APP = process.env.APP_URL ?? "http://localhost:3000";

/** A request carrying the current caller's cookie (set by asCaller). */
export function request(method: string, path: string, body?: unknown): Request {
  const headers = mockedHeaders();
  if (body !== undefined) headers.set("content-type", "application/json");
  return new Request(new URL(path, APP), { method, headers, body: body === undefined ? undefined : JSON.stringify(body) });
}

let seq = 0;
export const unique = (prefix: string) => `${prefix}-${Date.now().toString(36)}-${++seq}`;

/** A fresh user for actions that change someone (changing a world user would disturb other cells). */
export async function throwawayUser(): Promise<string> {
  const id = crypto.randomUUID();
  const now = new Date();
  await db("user").insert({ id, name: "Target Person", email: `${unique("target")}@roles.test`, emailVerified: true, role: "engineer", banned: false, createdAt: now, updatedAt: now });
  return id;
}

export async function throwawayInvitation(world: RoleWorld, expired = false): Promise<{ id: number; token: string }> {
  const issued = await issueInvitation(
    { id: world.users.admin.id, name: world.users.admin.name },
    { name: "Invited Person", email: `${unique("invitee")}@roles.test`, role: "engineer", vesselIds: [world.vessel1] },
  );
  if (issued.kind !== "issued") throw new Error("invitation not issued");
  if (expired) await db("invitations").where({ id: issued.invitationId }).update({ expires_at: new Date(Date.now() - 60_000) });
  return { id: issued.invitationId, token: issued.token };
}

/**
 * A valid IMO number not used before: six digits, then the check digit. Invented numbers start
 * with 1–4, a block not issued to ships (issued numbers start 5–9 [memory]).
 */
export function freshImo(): string {
  const six = String(100000 + ((Date.now() + ++seq * 7919) % 400000));
  const check = [7, 6, 5, 4, 3, 2].reduce((s, w, i) => s + w * Number(six[i]), 0) % 10;
  return `${six}${check}`;
}

export async function firstUnitOf(engineId: number): Promise<number> {
  const row = await db("cylinder_units").where({ engine_id: engineId }).orderBy("cylinder_no").first("id");
  return row.id;
}
