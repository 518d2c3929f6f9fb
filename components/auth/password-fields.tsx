"use client";

import { FieldError, Input, Label } from "@/components/ui/field";

/** New password + confirmation, controlled so a refused submit keeps what was typed. */
export function PasswordFields({
  password,
  confirm,
  onPassword,
  onConfirm,
  errors,
  minLength,
}: {
  password: string;
  confirm: string;
  onPassword: (v: string) => void;
  onConfirm: (v: string) => void;
  errors: Record<string, string[] | undefined>;
  minLength: number;
}) {
  return (
    <>
      <div>
        <Label htmlFor="password">New password</Label>
        <Input
          id="password"
          name="password"
          type="password"
          autoComplete="new-password"
          required
          minLength={minLength}
          value={password}
          onChange={(e) => onPassword(e.target.value)}
          aria-invalid={!!errors.password}
          aria-describedby="password-hint password-error"
          className="mt-1"
        />
        <p id="password-hint" className="mt-1 text-xs text-ink-faint">
          At least {minLength} characters. A short sentence is easy to remember and hard to guess.
        </p>
        <FieldError id="password-error" messages={errors.password} />
      </div>
      <div>
        <Label htmlFor="confirmPassword">Type it again</Label>
        <Input
          id="confirmPassword"
          name="confirmPassword"
          type="password"
          autoComplete="new-password"
          required
          value={confirm}
          onChange={(e) => onConfirm(e.target.value)}
          aria-invalid={!!errors.confirmPassword}
          aria-describedby="confirm-error"
          className="mt-1"
        />
        <FieldError id="confirm-error" messages={errors.confirmPassword} />
      </div>
    </>
  );
}
