import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { isRefused, type ActionState } from "@/lib/auth/action-state";
import { can } from "@/lib/auth/permissions";
import { ACTION_RULES, API_ROUTE_RULES, type AccessRule } from "@/lib/auth/route-rules";
import type { Role } from "@/lib/auth/roles";
import { db } from "@/lib/db/knex";
import type { ActionCase, Caller, MatrixCases, RouteCase } from "../support/matrix";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { signInCookie } from "../support/sessions";

/*
 * The authorization matrix: every API route handler and every server action, called as
 * each role, as a visitor with no session, and as crew of another vessel. The expected
 * answer of each cell comes from the registry (route-rules.ts) and the permission table
 * (permissions.ts); the routes and actions come from the files on disk, so a new route
 * or action without a rule, or a rule without a case in tests/integration/matrix-cases/,
 * fails this test.
 *
 * Refused = 401/403, or 404 for a target outside the caller's vessels (not revealing it
 * exists is also a refusal). Allowed = a 2xx/3xx answer, or an action that ran to success.
 */

const ROOT = path.resolve(import.meta.dirname, "../..");
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

function walk(dir: string, match: (file: string) => boolean, out: string[] = []): string[] {
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    if (entry.name === "node_modules" || entry.name.startsWith(".")) continue;
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) walk(full, match, out);
    else if (match(full)) out.push(full);
  }
  return out;
}

/** app/api/vessels/[vesselId]/route.ts → /api/vessels/[vesselId] (route groups dropped). */
function routePath(file: string): string {
  const rel = path.relative(path.join(ROOT, "app"), path.dirname(file)).split(path.sep);
  return "/" + rel.filter((seg) => !/^\(.*\)$/.test(seg)).join("/");
}

type Outcome = { refused: boolean; status: "ok" | "refused" | "failed"; detail: string };

const routeCases: Record<string, RouteCase> = {};
const actionCases: Record<string, ActionCase> = {};

/** The vessel each scoped case targets (vessel 1, so crew of vessel 2 are "another vessel"). */
const TARGET_VESSEL = (w: RoleWorld) => w.vessel1;

function expectedAllowed(rule: AccessRule, caller: Caller, world: RoleWorld): boolean {
  if (rule.public) return true;
  if (!caller.user) return false;
  if (!can(caller.user.role as Role, rule.permission)) return false;
  if (!rule.vesselScoped) return true;
  return caller.user.role === "admin" || caller.user.vesselIds.includes(TARGET_VESSEL(world));
}

let world: RoleWorld;
const cookies = new Map<string, string>();
let callers: Caller[] = [];
const discoveredRoutes = new Map<string, (req: Request, ctx: { params: Promise<unknown> }) => Promise<Response>>();
const discoveredActions = new Map<string, (prev: ActionState | undefined, input: Record<string, unknown>) => Promise<ActionState>>();

beforeAll(async () => {
  for (const file of walk(path.join(import.meta.dirname, "matrix-cases"), (f) => /\.ts$/.test(f))) {
    const cases = (await import(file)) as MatrixCases;
    for (const [k, v] of Object.entries(cases.routeCases ?? {})) {
      if (routeCases[k]) throw new Error(`two matrix cases for ${k}`);
      routeCases[k] = v;
    }
    for (const [k, v] of Object.entries(cases.actionCases ?? {})) {
      if (actionCases[k]) throw new Error(`two matrix cases for ${k}`);
      actionCases[k] = v;
    }
  }
  world = await buildRoleWorld(db);
  const u = world.users;
  callers = [
    { label: "anonymous", user: null },
    { label: "admin", user: u.admin },
    { label: "superintendent", user: u.supt },
    { label: "chief engineer (vessel 1)", user: u.chief },
    { label: "engineer (vessel 1)", user: u.engineer },
    { label: "chief engineer of another vessel", user: u.chief2 },
    { label: "engineer of another vessel", user: u.engineer2 },
  ];
  for (const c of callers) if (c.user) cookies.set(c.user.id, await signInCookie(c.user.email, WORLD_PASSWORD));

  for (const file of walk(path.join(ROOT, "app", "api"), (f) => /[\\/]route\.tsx?$/.test(f))) {
    const mod = (await import(file)) as Record<string, unknown>;
    for (const m of METHODS) if (typeof mod[m] === "function") discoveredRoutes.set(`${m} ${routePath(file)}`, mod[m] as never);
  }
  const actionFiles = [
    ...walk(path.join(ROOT, "lib"), (f) => /actions\.tsx?$/.test(f)),
    ...walk(path.join(ROOT, "app"), (f) => /actions\.tsx?$/.test(f)),
  ].filter((f) => /^\s*["']use server["']/.test(readFileSync(f, "utf8")));
  for (const file of actionFiles) {
    const mod = (await import(file)) as Record<string, unknown>;
    for (const [name, value] of Object.entries(mod)) if (typeof value === "function") discoveredActions.set(name, value as never);
  }
}, 120_000);

function signInAs(caller: Caller) {
  asCaller(caller.user ? cookies.get(caller.user.id)! : null);
}

async function callRoute(key: string, caller: Caller): Promise<Outcome> {
  signInAs(caller);
  const { request, params } = await routeCases[key](world, caller);
  const res = await discoveredRoutes.get(key)!(request, { params: Promise.resolve(params ?? {}) });
  // The sign-out case ends the caller's session; give them a fresh one for the cells that follow.
  if (key === "POST /api/auth/[...all]" && caller.user) cookies.set(caller.user.id, await signInCookie(caller.user.email, WORLD_PASSWORD));
  const detail = `${res.status} ${(await res.text()).slice(0, 200)}`;
  if ([401, 403, 404].includes(res.status)) return { refused: true, status: "refused", detail };
  return { refused: false, status: res.status < 400 ? "ok" : "failed", detail };
}

async function callAction(name: string, caller: Caller): Promise<Outcome> {
  const input = await actionCases[name](world, caller);
  signInAs(caller);
  try {
    const state = await discoveredActions.get(name)!(undefined, input);
    const detail = `${state.ok ? "ok" : state.code}: ${state.message} ${JSON.stringify(state.fieldErrors)}`;
    if (isRefused(state) || state.code === "not_found") return { refused: true, status: "refused", detail };
    return { refused: false, status: state.ok ? "ok" : "failed", detail };
  } catch (err) {
    // redirect() after success (e.g. signing in after accepting an invitation) ends the action early.
    const digest = (err as { digest?: string }).digest ?? "";
    if (digest.startsWith("NEXT_REDIRECT")) return { refused: false, status: "ok", detail: `redirect ${digest}` };
    throw err;
  }
}

describe("registry covers everything on disk", () => {
  it("every API route handler has a rule, and every rule a handler", () => {
    const onDisk = [...discoveredRoutes.keys()].sort();
    const ruled = Object.keys(API_ROUTE_RULES).sort();
    expect(onDisk.filter((k) => !ruled.includes(k)), "routes without a rule in lib/auth/route-rules.ts").toEqual([]);
    expect(ruled.filter((k) => !onDisk.includes(k)), "rules for routes that no longer exist").toEqual([]);
  });

  it("every server action has a rule, and every rule an action", () => {
    const onDisk = [...discoveredActions.keys()].sort();
    const ruled = Object.keys(ACTION_RULES).sort();
    expect(onDisk.filter((k) => !ruled.includes(k)), "actions without a rule in lib/auth/route-rules.ts").toEqual([]);
    expect(ruled.filter((k) => !onDisk.includes(k)), "rules for actions that no longer exist").toEqual([]);
  });

  it("every rule has a case in this matrix", () => {
    expect(Object.keys(API_ROUTE_RULES).filter((k) => !(k in routeCases)), "rules without a case in tests/integration/matrix-cases/").toEqual([]);
    expect(Object.keys(ACTION_RULES).filter((k) => !(k in actionCases)), "rules without a case in tests/integration/matrix-cases/").toEqual([]);
  });
});

describe.each(Object.keys(API_ROUTE_RULES))("route %s", (key) => {
  const rule = (API_ROUTE_RULES as Record<string, AccessRule>)[key];
  it.each(["anonymous", "admin", "superintendent", "chief engineer (vessel 1)", "engineer (vessel 1)", "chief engineer of another vessel", "engineer of another vessel"])(
    "as %s",
    async (label) => {
      expect(discoveredRoutes.has(key), `no handler exported for ${key}`).toBe(true);
      const caller = callers.find((c) => c.label === label)!;
      const allowed = expectedAllowed(rule, caller, world);
      expect(routeCases[key], `no matrix case for ${key}`).toBeTypeOf("function");
      const outcome = await callRoute(key, caller);
      expect(outcome.status, outcome.detail).toBe(allowed ? "ok" : "refused");
    },
  );
});

describe.each(Object.keys(ACTION_RULES))("action %s", (name) => {
  const rule = (ACTION_RULES as Record<string, AccessRule>)[name];
  it.each(["anonymous", "admin", "superintendent", "chief engineer (vessel 1)", "engineer (vessel 1)", "chief engineer of another vessel", "engineer of another vessel"])(
    "as %s",
    async (label) => {
      expect(discoveredActions.has(name), `no action exported named ${name}`).toBe(true);
      const caller = callers.find((c) => c.label === label)!;
      const allowed = expectedAllowed(rule, caller, world);
      expect(actionCases[name], `no matrix case for ${name}`).toBeTypeOf("function");
      const outcome = await callAction(name, caller);
      expect(outcome.status, outcome.detail).toBe(allowed ? "ok" : "refused");
    },
  );
});
