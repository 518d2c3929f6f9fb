"use client";

import { startTransition, useActionState } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/form-message";
import { initialActionState } from "@/lib/auth/action-state";
import { requestNewInvitationAction } from "@/lib/invitations/actions";

/** Asks the person who sent the invitation for a fresh one; shown for expired or withdrawn links. */
export function RequestInvitationButton({ token }: { token: string }) {
  const [state, dispatch, pending] = useActionState(requestNewInvitationAction, initialActionState);
  return (
    <div className="mt-6 space-y-3">
      {state.ok ? null : (
        <Button
          type="button"
          size="lg"
          className="w-full"
          disabled={pending}
          onClick={() => startTransition(() => dispatch({ token }))}
        >
          {pending ? "Asking…" : "Ask for a new invitation"}
        </Button>
      )}
      <FormMessage ok={state.ok} message={state.message} />
    </div>
  );
}
