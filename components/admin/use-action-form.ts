"use client";

import { useState, useTransition } from "react";
import type { FieldValues, Path, UseFormReturn } from "react-hook-form";
import { initialActionState, type ActionState } from "@/lib/auth/action-state";

type ServerAction<T> = (prev: ActionState | undefined, input: Record<string, unknown>) => Promise<ActionState<T>>;

/**
 * Submits a react-hook-form form to a server action: the browser validates with the shared
 * schema first, the server parses again, and the server's field errors land on the same
 * fields. The form keeps its values either way; `pending` disables the submit button so a
 * double click sends once.
 */
export function useActionForm<V extends FieldValues, T = unknown>(
  form: UseFormReturn<V>,
  action: ServerAction<T>,
  onSuccess?: (state: ActionState<T>) => void,
) {
  const [state, setState] = useState<ActionState<T>>(initialActionState as ActionState<T>);
  const [transitioning, startTransition] = useTransition();
  const submit = form.handleSubmit(
    (values) =>
      new Promise<void>((resolve) => {
        startTransition(async () => {
          const result = await action(undefined, values as Record<string, unknown>);
          setState(result);
          for (const [path, messages] of Object.entries(result.fieldErrors)) {
            if (path) form.setError(path as Path<V>, { type: "server", message: messages.join(" ") });
          }
          if (result.ok) onSuccess?.(result);
          resolve();
        });
      }),
    () => setState({ ...initialActionState, message: "Check the fields marked below." } as ActionState<T>),
  );
  return { state, submit, pending: transitioning || form.formState.isSubmitting };
}

/** The message of a (possibly nested) field error from react-hook-form's error tree. */
export function errorAt(errors: unknown, path: string): string[] | undefined {
  let node: unknown = errors;
  for (const part of path.split(".")) {
    if (!node || typeof node !== "object") return undefined;
    node = (node as Record<string, unknown>)[part];
  }
  const message = (node as { message?: unknown } | undefined)?.message;
  if (typeof message === "string" && message) return [message];
  const root = (node as { root?: { message?: string } } | undefined)?.root?.message;
  return root ? [root] : undefined;
}
