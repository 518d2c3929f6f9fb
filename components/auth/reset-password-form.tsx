"use client";

import Link from "next/link";
import { useState } from "react";
import { Button, buttonClass } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/form-message";
import { authClient } from "@/lib/auth/auth-client";
import { PASSWORD_MIN, resetPasswordSchema } from "@/lib/invitations/schemas";
import { PasswordFields } from "./password-fields";

export function ResetPasswordForm({ token }: { token: string }) {
  const [password, setPassword] = useState("");
  const [confirm, setConfirm] = useState("");
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  const [pending, setPending] = useState(false);

  async function onSubmit(e: React.FormEvent) {
    e.preventDefault();
    if (pending) return;
    const parsed = resetPasswordSchema.safeParse({ password, confirmPassword: confirm });
    if (!parsed.success) {
      const next: Record<string, string[]> = {};
      for (const i of parsed.error.issues) (next[String(i.path[0])] ??= []).push(i.message);
      setErrors(next);
      return;
    }
    setErrors({});
    setPending(true);
    const { error } = await authClient.resetPassword({ newPassword: password, token });
    setPending(false);
    if (!error) {
      setDone(true);
      return;
    }
    if (error.status === 429) setMessage("Too many attempts. Wait a minute, then try again.");
    else if (error.code === "INVALID_TOKEN") setMessage("This link has expired or was already used. Ask for a new one.");
    else if (error.code === "PASSWORD_TOO_SHORT") setErrors({ password: [`Use at least ${PASSWORD_MIN} characters.`] });
    else setMessage("The password could not be changed. Try again.");
  }

  if (done) {
    return (
      <div className="mt-6 space-y-4">
        <FormMessage ok message="Your password is changed. Any other signed-in devices have been signed out." />
        <Link href="/sign-in" className={`${buttonClass("primary", "lg")} w-full`}>Sign in</Link>
      </div>
    );
  }

  return (
    <form onSubmit={onSubmit} className="mt-6 space-y-4" noValidate>
      <PasswordFields password={password} confirm={confirm} onPassword={setPassword} onConfirm={setConfirm} errors={errors} minLength={PASSWORD_MIN} />
      <FormMessage ok={false} message={message} />
      {message?.startsWith("This link") ? (
        <Link href="/forgot-password" className={`${buttonClass("secondary")} w-full`}>Ask for a new link</Link>
      ) : null}
      <Button type="submit" size="lg" className="w-full" disabled={pending}>
        {pending ? "Saving…" : "Save new password"}
      </Button>
    </form>
  );
}
