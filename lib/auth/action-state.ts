/**
 * The shape every server action returns, shared with client forms (no server imports).
 * `values` echoes what was sent (never passwords) so a refused form keeps what was typed;
 * `fieldErrors` is keyed by the dotted path of the field ("stations.2.depthMm").
 */
export type FieldErrors = Record<string, string[]>;

export type ActionCode = "invalid" | "unauthenticated" | "forbidden" | "not_found" | "conflict" | "error";

export type ActionState<T = unknown> = {
  ok: boolean;
  message: string | null;
  fieldErrors: FieldErrors;
  values: Record<string, unknown>;
  code?: ActionCode;
  data?: T;
};

export const initialActionState: ActionState = { ok: false, message: null, fieldErrors: {}, values: {} };

/** Whether a result means the caller was turned away (no session, role or vessel). */
export function isRefused(state: ActionState): boolean {
  return state.code === "unauthenticated" || state.code === "forbidden";
}
