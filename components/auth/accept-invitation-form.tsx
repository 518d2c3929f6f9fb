"use client";

import { startTransition, useActionState, useState } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/form-message";
import { initialActionState } from "@/lib/auth/action-state";
import { acceptInvitationAction } from "@/lib/invitations/actions";
import { PASSWORD_MIN } from "@/lib/invitations/schemas";
import { PasswordFields } from "./password-fields";

export function AcceptInvitationForm({ token }: { token: string }) {
  const [state, dispatch, pending] = useActionState(acceptInvitationAction, initialActionState);
  const [password, setPassword] = useState("");
  const [confirm, setConfirm] = useState("");
  return (
    <form
      className="mt-6 space-y-4"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        if (pending) return;
        startTransition(() => dispatch({ token, password, confirmPassword: confirm }));
      }}
    >
      <PasswordFields
        password={password}
        confirm={confirm}
        onPassword={setPassword}
        onConfirm={setConfirm}
        errors={state.fieldErrors}
        minLength={PASSWORD_MIN}
      />
      <FormMessage ok={state.ok} message={state.fieldErrors.token?.[0] ?? state.message} />
      <Button type="submit" size="lg" className="w-full" disabled={pending}>
        {pending ? "Setting up your account…" : "Set password and sign in"}
      </Button>
    </form>
  );
}
