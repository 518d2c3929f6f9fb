import "server-only";
import { NextResponse } from "next/server";
import { ZodError, z } from "zod";
import { can, type Permission } from "./permissions";
import { apiRouteRule, type ApiRouteKey } from "./route-rules";
import { canSeeVessel, getCurrentUser, type CurrentUser } from "./session";

export class HttpError extends Error {
  constructor(
    public status: number,
    message: string,
    public details?: unknown,
  ) {
    super(message);
  }
}

export const notFound = (what = "Not found") => new HttpError(404, what);
export const forbidden = (why = "You do not have access to this.") => new HttpError(403, why);

type Handler<P> = (req: Request, ctx: { user: CurrentUser; params: P }) => Promise<Response>;

/**
 * Wraps a route handler: 401 without a session, 403 without the permission, 422 for
 * invalid input (ZodError), and the HttpError status otherwise — always JSON.
 */
export function withPermission<P = Record<string, string>>(permission: Permission, handler: Handler<P>) {
  return async (req: Request, ctx?: { params?: Promise<P> }): Promise<Response> => {
    try {
      const user = await getCurrentUser();
      if (!user) return NextResponse.json({ error: "Sign in first." }, { status: 401 });
      if (!can(user.role, permission)) {
        return NextResponse.json({ error: "Your role does not allow this.", permission }, { status: 403 });
      }
      return await handler(req, { user, params: ((await ctx?.params) ?? {}) as P });
    } catch (err) {
      return errorResponse(err);
    }
  };
}

type RouteOptions<P> = {
  /**
   * For vessel-scoped rules: the vessel the request targets (from params or body), or
   * null when the target does not exist (404). Required when the rule is scoped.
   */
  vesselOf?: (req: Request, params: P) => Promise<number | null>;
};

/**
 * Wraps a route handler with its rule from route-rules.ts: the permission comes from
 * the registry, never from the handler, and a vessel-scoped rule also checks that the
 * caller is assigned to the target vessel (403 otherwise). Public rules run without
 * a session. Refuses at import time when a scoped rule has no `vesselOf`.
 */
export function withRoute<P = Record<string, string>>(
  key: ApiRouteKey,
  handler: (req: Request, ctx: { user: CurrentUser; params: P; vesselId: number | null }) => Promise<Response>,
  options: RouteOptions<P> = {},
) {
  const rule = apiRouteRule(key);
  if (!rule) throw new Error(`No access rule for ${key} in lib/auth/route-rules.ts`);
  if (rule.public) throw new Error(`${key} is public: export the handler without withRoute`);
  if (rule.vesselScoped && !options.vesselOf) throw new Error(`${key} is vessel-scoped: pass vesselOf`);
  return withPermission<P>(rule.permission, async (req, ctx) => {
    let vesselId: number | null = null;
    if (rule.vesselScoped) {
      vesselId = await options.vesselOf!(req, ctx.params);
      if (vesselId === null) throw notFound();
      if (!canSeeVessel(ctx.user, vesselId)) throw forbidden("You are not assigned to this vessel.");
    }
    return handler(req, { ...ctx, vesselId });
  });
}

export function errorResponse(err: unknown): Response {
  if (err instanceof HttpError) return NextResponse.json({ error: err.message, details: err.details }, { status: err.status });
  if (err instanceof ZodError) {
    return NextResponse.json({ error: "Invalid input.", fields: z.flattenError(err).fieldErrors }, { status: 422 });
  }
  console.error(err);
  return NextResponse.json({ error: "Something went wrong on the server; nothing was changed." }, { status: 500 });
}

/** Parses a positive integer id from a route segment, or throws 404. */
export function parseId(value: string | undefined, what: string): number {
  const n = Number(value);
  if (!Number.isInteger(n) || n <= 0) throw notFound(`${what} not found.`);
  return n;
}
