import "server-only";
import { unstable_rethrow } from "next/navigation";
import type { ZodType } from "zod";
import { fieldMessages } from "@/lib/validation/issues";
import { ActionError } from "./action-error";
import type { ActionCode, ActionState, FieldErrors } from "./action-state";

export { ActionError };
import { can, type Permission } from "./permissions";
import { actionRule, type ActionName } from "./route-rules";
import { canSeeVessel } from "./scope";
import { getCurrentUser, type CurrentUser } from "./session";

export type ActionResult<T> = { message?: string; data?: T } | void;

type ActionContext = { user: CurrentUser | null; vesselId: number | null };

type ActionOptions<I> = {
  /** For vessel-scoped rules: the vessel the input targets, or null when it does not exist. */
  vesselOf?: (input: I) => Promise<number | null>;
};

/** Keys whose values are never echoed back to the browser. */
const SECRET_KEY = /password|secret/i;

/** FormData (repeated keys become arrays) or a plain object, as a plain object. */
function toObject(input: FormData | Record<string, unknown> | null | undefined): Record<string, unknown> {
  if (!input) return {};
  if (typeof FormData !== "undefined" && input instanceof FormData) {
    const out: Record<string, unknown> = {};
    for (const key of new Set(input.keys())) {
      if (key.startsWith("$ACTION")) continue; // Next's own fields for progressive enhancement
      const all = input.getAll(key).filter((v): v is string => typeof v === "string");
      out[key.replace(/\[\]$/, "")] = key.endsWith("[]") || all.length > 1 ? all : all[0];
    }
    return out;
  }
  return { ...(input as Record<string, unknown>) };
}

function echo(values: Record<string, unknown>): Record<string, unknown> {
  return Object.fromEntries(Object.entries(values).filter(([k]) => !SECRET_KEY.test(k)));
}

const refuse = (code: ActionCode, message: string, values: Record<string, unknown>, fieldErrors: FieldErrors = {}): ActionState => ({
  ok: false,
  code,
  message,
  fieldErrors,
  values: echo(values),
});

/**
 * A server action in three steps: parse the input with `schema` → check the session and
 * `permission` (null = public) and, with `vesselOf`, the caller's vessel scope → run `fn`.
 * Always resolves to an ActionState, so forms show the message and keep what was typed;
 * Next's redirect()/notFound() inside `fn` pass through.
 */
export function validatedActionWithPermission<S extends ZodType, T = unknown>(
  schema: S,
  permission: Permission | null,
  fn: (input: S["_output"], ctx: ActionContext) => Promise<ActionResult<T>>,
  options: ActionOptions<S["_output"]> = {},
) {
  return async (_prev: ActionState | undefined, input: FormData | Record<string, unknown>): Promise<ActionState<T>> => {
    const values = toObject(input);
    const parsed = schema.safeParse(values);
    if (!parsed.success) {
      const fieldErrors = fieldMessages(parsed.error);
      return refuse("invalid", fieldErrors[""]?.[0] ?? "Check the fields marked below.", values, fieldErrors) as ActionState<T>;
    }
    let user: CurrentUser | null = null;
    if (permission) {
      user = await getCurrentUser();
      if (!user) return refuse("unauthenticated", "Your session has ended. Sign in again.", values) as ActionState<T>;
      if (!can(user.role, permission)) return refuse("forbidden", "Your role does not allow this.", values) as ActionState<T>;
    }
    let vesselId: number | null = null;
    try {
      if (options.vesselOf) {
        vesselId = await options.vesselOf(parsed.data);
        // "Not there" and "not on your vessels" are one answer, so ids cannot be probed.
        if (vesselId === null || !user || !canSeeVessel(user, vesselId)) {
          return refuse("not_found", "That record does not exist, or it is on a vessel you are not assigned to.", values) as ActionState<T>;
        }
      }
      const result = (await fn(parsed.data, { user, vesselId })) ?? {};
      return { ok: true, message: result.message ?? null, fieldErrors: {}, values: echo(values), data: result.data };
    } catch (err) {
      unstable_rethrow(err);
      if (err instanceof ActionError) return refuse(err.code, err.message, values, err.fieldErrors) as ActionState<T>;
      console.error(err);
      return refuse("error", "Something went wrong on the server; nothing was changed.", values) as ActionState<T>;
    }
  };
}

/**
 * The usual way to write an action: its permission and scope come from ACTION_RULES by
 * name, so the registry is the one place that says who may call it. Fails at import
 * time when the rule is missing, or is scoped and no `vesselOf` is given.
 */
export function ruledAction<S extends ZodType, T = unknown>(
  name: ActionName,
  schema: S,
  fn: (input: S["_output"], ctx: ActionContext) => Promise<ActionResult<T>>,
  options: ActionOptions<S["_output"]> = {},
) {
  const rule = actionRule(name);
  if (!rule) throw new Error(`No access rule for action ${name} in lib/auth/route-rules.ts`);
  if (rule.public) return validatedActionWithPermission(schema, null, fn);
  if (rule.vesselScoped && !options.vesselOf) throw new Error(`Action ${name} is vessel-scoped: pass vesselOf`);
  return validatedActionWithPermission(schema, rule.permission, fn, options);
}

/** For action bodies that need the signed-in user (non-public rules always have one). */
export function actor(ctx: ActionContext): CurrentUser {
  if (!ctx.user) throw new ActionError("Sign in first.", {}, "unauthenticated");
  return ctx.user;
}
