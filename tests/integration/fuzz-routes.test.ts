import { readdirSync } from "node:fs";
import path from "node:path";
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { API_ROUTE_RULES } from "@/lib/auth/route-rules";
import { db } from "@/lib/db/knex";
import { outboxIdle } from "@/lib/mail/outbox";
import { changedTables, hostileId, hostileValue, INJECTIONS, snapshotTables, type FuzzCase, type FuzzInput, type RouteCaller, type WorldUserKey } from "../support/fuzz";
import { APP } from "../support/matrix";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { signInCookie } from "../support/sessions";

/*
 * Every API route of the registry, fuzzed with fast-check against the real handlers and
 * MariaDB. Inputs come from tests/integration/fuzz-cases/ (one case per route: real-shaped
 * bodies with hostile fields), mixed here with hostile ids in the address, random JSON,
 * bodies that are not JSON or not labelled JSON, and callers without a session or from
 * another vessel. For every request:
 *   - no answer is a 5xx;
 *   - every refusal is a 4xx whose JSON body says why in words;
 *   - a refused request leaves every table as it was (row count and CHECKSUM TABLE).
 * Then every text field takes each injection string (SQL, HTML/script, spreadsheet
 * formulas) and the API gives it back unchanged.
 *
 * FUZZ_RUNS sets the runs per route (default 20); FUZZ_SEED replays a failure.
 */

const RUNS = Number(process.env.FUZZ_RUNS ?? 20);
const SEED = process.env.FUZZ_SEED ? Number(process.env.FUZZ_SEED) : undefined;
const ROOT = path.resolve(import.meta.dirname, "../..");
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;
const STATE_CHANGING = new Set(["POST", "PUT", "PATCH", "DELETE"]);

type Handler = (req: Request, ctx: { params: Promise<unknown> }) => Promise<Response>;

function walk(dir: string, out: string[] = []): string[] {
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) walk(full, out);
    else if (/^route\.tsx?$/.test(entry.name)) out.push(full);
  }
  return out;
}

const routePath = (file: string) =>
  "/" + path.relative(path.join(ROOT, "app"), path.dirname(file)).split(path.sep).filter((s) => !/^\(.*\)$/.test(s)).join("/");

const cases: Record<string, FuzzCase<unknown>> = {};
const handlers = new Map<string, Handler>();
const fixtures = new Map<string, unknown>();
const cookies = new Map<WorldUserKey, string>();
/** Answers seen per route, printed at the end (the README quotes them). */
const statuses = new Map<string, Map<number, number>>();
let world: RoleWorld;

// Loaded before the tests are collected: the injection tests below are one per text field.
for (const file of readdirSync(path.join(import.meta.dirname, "fuzz-cases")).filter((f) => f.endsWith(".ts"))) {
  const mod = (await import(path.join(import.meta.dirname, "fuzz-cases", file))) as { fuzzCases?: Record<string, FuzzCase<unknown>> };
  for (const [k, v] of Object.entries(mod.fuzzCases ?? {})) {
    if (cases[k]) throw new Error(`two fuzz cases for ${k}`);
    cases[k] = v;
  }
}

beforeAll(async () => {
  for (const file of walk(path.join(ROOT, "app", "api"))) {
    const mod = (await import(file)) as Record<string, unknown>;
    for (const m of METHODS) if (typeof mod[m] === "function") handlers.set(`${m} ${routePath(file)}`, mod[m] as Handler);
  }
  world = await buildRoleWorld(db, "fuzz");
  for (const key of ["engineer", "chief", "supt", "admin", "engineer2"] as const) cookies.set(key, await signInCookie(world.users[key].email, WORLD_PASSWORD));
}, 120_000);

/** "/api/inspections/[inspectionId]/photos/[photoId]" with params filled in (catch-all segments joined). */
function fillPath(routeKey: string, params: Record<string, string | string[]>, query = ""): string {
  const template = routeKey.split(" ")[1];
  const filled = template.replace(/\[(?:\.\.\.)?(\w+)\]/g, (_, name: string) => {
    const v = params[name];
    return Array.isArray(v) ? v.map(encodeURIComponent).join("/") : encodeURIComponent(v ?? "");
  });
  return filled + (query ? `?${query}` : "");
}

type Caller = WorldUserKey | "anonymous";

function buildRequest(key: string, input: FuzzInput, caller: Caller, origin: string | null): Request {
  const method = key.split(" ")[0];
  asCaller(caller === "anonymous" ? null : cookies.get(caller)!);
  const headers = mockedHeaders();
  if (origin === null) headers.delete("origin");
  else headers.set("origin", origin);
  for (const [k, v] of Object.entries(input.headers ?? {})) {
    try {
      headers.set(k, v);
    } catch {
      // A value no HTTP client could send (a line break, say) is left out.
    }
  }
  let body: string | undefined;
  if (input.raw) {
    body = input.raw.text;
    if (input.raw.contentType) headers.set("content-type", input.raw.contentType);
  } else if (input.body !== undefined) {
    body = JSON.stringify(input.body);
    headers.set("content-type", "application/json");
  }
  let url: URL;
  try {
    url = new URL(fillPath(key, input.params ?? {}, input.query), APP);
  } catch {
    url = new URL(fillPath(key, {}, ""), APP);
  }
  return new Request(url, { method, headers, body: method === "GET" ? undefined : body });
}

async function send(key: string, input: FuzzInput, caller: Caller, origin: string | null = APP) {
  const res = await handlers.get(key)!(buildRequest(key, input, caller, origin), { params: Promise.resolve(input.params ?? {}) });
  const text = await res.text();
  let json: unknown = null;
  try {
    json = text ? JSON.parse(text) : null;
  } catch {
    json = null;
  }
  return { status: res.status, text, json, location: res.headers.get("location") };
}

const callAs: RouteCaller = async (key, input, as = "supt") => {
  const r = await send(key, input, as);
  return { status: r.status, json: r.json };
};

/** A snapshot once the mail sender is idle (it marks mail sent after an earlier, accepted request). */
async function settledSnapshot(except?: string[]) {
  await outboxIdle();
  return snapshotTables(db, except);
}

/** The words a refusal gives: Kalibore's `error`, or better-auth's `message`. */
function reasonOf(json: unknown): string {
  const o = (json ?? {}) as { error?: unknown; message?: unknown };
  const r = typeof o.error === "string" ? o.error : typeof o.message === "string" ? o.message : "";
  return r.trim();
}

/** Every input the fuzzer sends to a route: the case's own, mixed with what any client could send. */
function inputsFor(key: string, c: FuzzCase<unknown>, fx: unknown): fc.Arbitrary<{ input: FuzzInput; caller: Caller; origin: string | null }> {
  const method = key.split(" ")[0];
  const names = [...key.matchAll(/\[(\.\.\.)?(\w+)\]/g)].map((m) => ({ name: m[2], catchAll: !!m[1] }));
  const hostileParams = fc.record(Object.fromEntries(names.map((n) => [n.name, n.catchAll ? fc.array(hostileId(), { minLength: 1, maxLength: 3 }) : hostileId()]))) as fc.Arbitrary<
    Record<string, string | string[]>
  >;
  const params: fc.Arbitrary<Record<string, string | string[]> | undefined> = names.length
    ? fc.oneof({ weight: 4, arbitrary: c.params ? c.params(fx) : hostileParams }, { weight: 1, arbitrary: hostileParams })
    : fc.constant(undefined);
  const query = fc.oneof({ weight: 4, arbitrary: c.query ? c.query(fx) : fc.constant("") }, { weight: 1, arbitrary: fc.string({ maxLength: 30 }).map(encodeURIComponent) });
  type Payload = Pick<FuzzInput, "body" | "raw">;
  const payload: fc.Arbitrary<Payload> = STATE_CHANGING.has(method)
    ? fc.oneof(
        { weight: 8, arbitrary: (c.body ? c.body(fx) : fc.constant(undefined)).map((body): Payload => ({ body })) },
        { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }).map((body): Payload => ({ body })) },
        { weight: 1, arbitrary: hostileValue().map((body): Payload => ({ body })) },
        {
          weight: 1,
          arbitrary: fc
            .tuple(fc.oneof(fc.string({ maxLength: 60 }), fc.constantFrom("{", "{\"a\":", "[1,2", "\u0000", "{\"revision\":1e999}")), fc.constantFrom("application/json", "text/plain", "application/x-www-form-urlencoded", "multipart/form-data; boundary=x", null))
            .map(([text, contentType]): Payload => ({ raw: { text, contentType } })),
        },
      )
    : fc.constant({});
  const caller = fc.oneof(
    { weight: 10, arbitrary: fc.constant(c.as as Caller) },
    { weight: 1, arbitrary: fc.constantFrom<Caller>("anonymous", "engineer2") },
  );
  const origin = STATE_CHANGING.has(method)
    ? fc.oneof({ weight: 12, arbitrary: fc.constant<string | null>(APP) }, { weight: 1, arbitrary: fc.constantFrom<string | null>(null, "https://evil.example", "null", `${APP}.evil.example`) })
    : fc.constant<string | null>(APP);
  const headers = c.headers ? c.headers(fx) : fc.constant(undefined);
  return fc.record({ params, query, payload, caller, origin, headers }).map(({ params: p, query: q, payload: b, caller: who, origin: o, headers: h }) => ({
    input: { ...(p ? { params: p } : {}), ...(q ? { query: q } : {}), ...(h ? { headers: h } : {}), ...b },
    caller: who,
    origin: o,
  }));
}

describe("the fuzz cases cover the registry", () => {
  it("every API route of lib/auth/route-rules.ts has a fuzz case in tests/integration/fuzz-cases/, and every case a route", () => {
    const ruled = Object.keys(API_ROUTE_RULES).sort();
    expect(ruled.filter((k) => !cases[k]), "routes without a fuzz case: add one to tests/integration/fuzz-cases/").toEqual([]);
    expect(Object.keys(cases).filter((k) => !ruled.includes(k)), "fuzz cases for routes not in the registry").toEqual([]);
  });
});

describe.each(Object.keys(API_ROUTE_RULES))("fuzzed %s", (key) => {
  it(`${RUNS} runs: no 5xx, every refusal a 4xx saying why, nothing half-written`, async () => {
    const c = cases[key];
    expect(c, `no fuzz case for ${key}`).toBeDefined();
    expect(handlers.has(key), `no handler exported for ${key}`).toBe(true);
    if (!fixtures.has(key)) fixtures.set(key, await c.setup(world));
    const fx = fixtures.get(key);
    const method = key.split(" ")[0];
    const seen = new Map<number, number>();
    await fc.assert(
      fc.asyncProperty(inputsFor(key, c, fx), async ({ input, caller, origin }) => {
        const prepared = c.prepare ? await c.prepare(fx, input) : input;
        const before = STATE_CHANGING.has(method) ? await settledSnapshot(c.mayWrite) : null;
        const res = await send(key, prepared, caller, origin);
        seen.set(res.status, (seen.get(res.status) ?? 0) + 1);
        const what = `${key} as ${caller} → ${res.status} ${res.text.slice(0, 300)}\ninput: ${JSON.stringify(prepared).slice(0, 600)}`;
        expect(res.status, what).toBeLessThan(500);
        if (res.status >= 400) {
          expect(reasonOf(res.json), `a refusal must say why: ${what}`).not.toBe("");
          if (before) {
            const changed = changedTables(before, await settledSnapshot(c.mayWrite));
            expect(changed, `a refused request changed the database (${changed.join("; ")}): ${what}`).toEqual([]);
          }
        }
      }),
      { numRuns: RUNS, seed: SEED, endOnFailure: true, includeErrorInReport: true },
    );
    // The fuzzer must reach past the gate: some runs were answered by the route itself, not only by the wrapper's checks.
    expect([...seen.keys()].some((s) => ![401, 403, 413, 415].includes(s)), `only the gate answered: ${JSON.stringify([...seen])}`).toBe(true);
    statuses.set(key, seen);
    // A fuzzed sign-out may have ended a caller's session: later routes get fresh ones.
    if (key.includes("/api/auth/")) for (const [who] of cookies) cookies.set(who, await signInCookie(world.users[who].email, WORLD_PASSWORD));
  });
});

afterAll(() => {
  const lines = [...statuses].map(([k, m]) => `${k}: ${[...m].sort(([a], [b]) => a - b).map(([s, n]) => `${s}×${n}`).join(" ")}`);
  console.log(`fuzzed ${statuses.size} routes, ${RUNS} runs each\n${lines.join("\n")}`);
});

describe("injection strings come back as text", () => {
  const withEcho = Object.entries(cases).filter(([, c]) => c.echo?.length);
  it("some routes take text", () => expect(withEcho.length).toBeGreaterThan(0));
  for (const [key, c] of Object.entries(cases)) {
    for (const e of c.echo ?? []) {
      it(`${key}: ${e.field}`, async () => {
        if (!fixtures.has(key)) fixtures.set(key, await c.setup(world));
        const fx = fixtures.get(key);
        for (const text of INJECTIONS) {
          const input = await e.send(fx, text);
          const res = await send(key, input, c.as);
          expect(res.status, `${key} ${e.field} = ${JSON.stringify(text)} → ${res.text.slice(0, 300)}`).toBeLessThan(300);
          const back = await e.readBack(fx, callAs, { status: res.status, json: res.json });
          // Text fields are trimmed of surrounding white space, nothing else.
          expect(back, `${e.field} sent as ${JSON.stringify(text)}`).toBe(text.trim());
        }
      }, 60_000);
    }
  }
});
