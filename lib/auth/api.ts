import "server-only";
import { NextResponse } from "next/server";
import { ZodError } from "zod";
import { serverEnv } from "@/lib/env";
import { HttpError } from "@/lib/http/errors";
import { RETRY_AFTER_S, unavailableMessage, unavailableService } from "@/lib/http/unavailable";
import { parseRecordId } from "@/lib/validation/ids";
import { describeIssues } from "@/lib/validation/issues";
import { can, type Permission } from "./permissions";
import { apiRouteRule, type ApiRouteKey } from "./route-rules";
import { canSeeVessel } from "./scope";
import { getCurrentUser, type CurrentUser } from "./session";

export { HttpError };

export const notFound = (what = "Not found.") => new HttpError(404, what);
export const forbidden = (why = "You do not have access to this.") => new HttpError(403, why);

/** Methods that change something: these pass the request checks below. */
const STATE_CHANGING = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/**
 * Largest request body a route accepts. A whole draft of a big engine with long notes is
 * tens of kB; this leaves room for that and refuses anything larger before it is read.
 */
export const MAX_BODY_BYTES = 128 * 1024;

/** The origins the app is opened from: APP_URL, and its 127.0.0.1/localhost twin (as for sign-in). */
export function appOrigins(appUrl = serverEnv.APP_URL): string[] {
  const origin = new URL(appUrl).origin;
  const twin = origin.includes("//localhost") ? origin.replace("//localhost", "//127.0.0.1") : origin.replace("//127.0.0.1", "//localhost");
  return [...new Set([origin, twin])];
}

async function readCapped(req: Request): Promise<Uint8Array<ArrayBuffer>> {
  const declared = Number(req.headers.get("content-length") ?? "");
  if (Number.isFinite(declared) && declared > MAX_BODY_BYTES) throw tooLarge();
  if (!req.body) return new Uint8Array(new ArrayBuffer(0));
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > MAX_BODY_BYTES) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge();
    }
    chunks.push(value);
  }
  const out = new Uint8Array(new ArrayBuffer(total));
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

const tooLarge = () => new HttpError(413, `The request is larger than ${MAX_BODY_BYTES / 1024} kB; nothing was changed.`);

/**
 * What every state-changing request must show before anything else runs: an Origin header
 * naming this app (a page on another site cannot make a signed-in browser change records;
 * browsers always send Origin on POST/PUT/DELETE), a JSON body if it has a body at all (a
 * cross-site form can only send form or text bodies), and a body no larger than
 * MAX_BODY_BYTES. Returns the request with its body read, for the handler to parse.
 */
export async function checkStateChangingRequest(req: Request): Promise<Request> {
  if (!STATE_CHANGING.has(req.method)) return req;
  const origin = req.headers.get("origin");
  if (!origin || !appOrigins().includes(origin)) {
    throw new HttpError(403, "This request did not come from a Kalibore page, so it was refused. Reload the page and try again.");
  }
  const type = (req.headers.get("content-type") ?? "").split(";")[0].trim().toLowerCase();
  const body = await readCapped(req);
  if (body.byteLength > 0 && type !== "application/json") {
    throw new HttpError(415, "The request body must be JSON (Content-Type: application/json); nothing was changed.");
  }
  return new Request(req.url, { method: req.method, headers: req.headers, body: body.byteLength ? body : undefined });
}

type RouteContext<P> = { user: CurrentUser; params: P; vesselId: number | null };

type RouteOptions<P> = {
  /**
   * For vessel-scoped rules: the vessel the request targets (from params or body), or
   * null when the target does not exist. Required when the rule is scoped.
   */
  vesselOf?: (req: Request, params: P) => Promise<number | null>;
};

/**
 * Wraps a route handler with its rule from route-rules.ts; the only way a route handler is
 * exported. In order: a state-changing request must come from the app's origin (403), carry
 * JSON (415) and fit MAX_BODY_BYTES (413); then 401 without a session, 403 without the
 * permission (taken from the registry, never from the handler); for a vessel-scoped rule,
 * 404 alike for a target that does not exist and one outside the caller's vessels, so ids
 * cannot be probed. Errors become JSON: HttpError with its status, ZodError 400. Refuses at
 * import time when the rule is missing, public, or scoped without `vesselOf`.
 */
export function withRoute<P = Record<string, string>>(
  key: ApiRouteKey,
  handler: (req: Request, ctx: RouteContext<P>) => Promise<Response>,
  options: RouteOptions<P> = {},
) {
  const rule = apiRouteRule(key);
  if (!rule) throw new Error(`No access rule for ${key} in lib/auth/route-rules.ts`);
  if (rule.public) throw new Error(`${key} is public: export the handler without withRoute`);
  if (rule.vesselScoped && !options.vesselOf) throw new Error(`${key} is vessel-scoped: pass vesselOf`);
  const permission: Permission = rule.permission;
  return async (incoming: Request, ctx?: { params?: Promise<P> }): Promise<Response> => {
    try {
      const req = await checkStateChangingRequest(incoming);
      const user = await getCurrentUser();
      if (!user) return NextResponse.json({ error: "Sign in first." }, { status: 401 });
      if (!can(user.role, permission)) return NextResponse.json({ error: "Your role does not allow this.", permission }, { status: 403 });
      const params = ((await ctx?.params) ?? {}) as P;
      let vesselId: number | null = null;
      if (rule.vesselScoped) {
        vesselId = await options.vesselOf!(req, params);
        if (vesselId === null || !canSeeVessel(user, vesselId)) throw notFound("Not found: no such record on your vessels.");
      }
      return await handler(req, { user, params, vesselId });
    } catch (err) {
      return errorResponse(err);
    }
  };
}

/** The JSON answer for anything a handler throws. */
export function errorResponse(err: unknown): Response {
  if (err instanceof HttpError) return NextResponse.json({ error: err.message, details: err.details }, { status: err.status });
  if (err instanceof ZodError) {
    const { message, field, fields } = describeIssues(err);
    return NextResponse.json({ error: message, details: { field, fields } }, { status: 400 });
  }
  // The database or the object store is down: a clear 503 the device retries, not a 500.
  const down = unavailableService(err);
  if (down) {
    console.error(`${down} unavailable:`, (err as Error)?.message ?? err);
    return NextResponse.json({ error: unavailableMessage(down), details: { unavailable: down } }, { status: 503, headers: { "retry-after": String(RETRY_AFTER_S) } });
  }
  console.error(err);
  return NextResponse.json({ error: "Something went wrong on the server; nothing was changed." }, { status: 500 });
}

/** Parses a record id from a route segment (lib/validation/ids.ts), or throws 404. */
export function parseId(value: string | undefined, what: string): number {
  const id = parseRecordId(value);
  if (id === null) throw notFound(`${what} not found.`);
  return id;
}
