import type { ActionCode, FieldErrors } from "./action-state";

/**
 * Thrown inside an action body (or a mutation it calls) to refuse with a message and, optionally,
 * the field at fault. Kept free of Next.js imports so that mutations throwing it also load in
 * scripts and benchmarks outside a Next.js server.
 */
export class ActionError extends Error {
  constructor(
    message: string,
    public fieldErrors: FieldErrors = {},
    public code: ActionCode = "conflict",
  ) {
    super(message);
  }
}
