"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { FieldError, Input, Label } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { authClient } from "@/lib/auth/auth-client";
import { forgotPasswordSchema } from "@/lib/invitations/schemas";

export function ForgotPasswordForm() {
  const [email, setEmail] = useState("");
  const [fieldError, setFieldError] = useState<string | null>(null);
  const [result, setResult] = useState<{ ok: boolean; message: string } | null>(null);
  const [pending, setPending] = useState(false);

  async function onSubmit(e: React.FormEvent) {
    e.preventDefault();
    if (pending) return;
    const parsed = forgotPasswordSchema.safeParse({ email });
    if (!parsed.success) {
      setFieldError(parsed.error.issues[0]?.message ?? "Enter a valid e-mail address.");
      return;
    }
    setFieldError(null);
    setPending(true);
    const { error } = await authClient.requestPasswordReset({ email: parsed.data.email, redirectTo: "/reset-password" });
    setPending(false);
    if (error?.status === 429) setResult({ ok: false, message: "Too many requests. Wait a minute, then try again." });
    else if (error && error.status && error.status >= 500) setResult({ ok: false, message: "The server could not be reached. Try again." });
    // The same answer whether or not the address has an account.
    else setResult({ ok: true, message: "If an account uses this address, a link to choose a new password is on its way. It works for one hour." });
  }

  return (
    <form onSubmit={onSubmit} className="mt-6 space-y-4" noValidate>
      <div>
        <Label htmlFor="email">E-mail</Label>
        <Input
          id="email"
          type="email"
          autoComplete="username"
          inputMode="email"
          required
          value={email}
          onChange={(e) => setEmail(e.target.value)}
          aria-invalid={!!fieldError}
          className="mt-1"
        />
        <FieldError messages={fieldError ? [fieldError] : undefined} />
      </div>
      <FormMessage ok={!!result?.ok} message={result?.message} />
      <Button type="submit" size="lg" className="w-full" disabled={pending}>
        {pending ? "Sending…" : "Send me a link"}
      </Button>
    </form>
  );
}
