import { z } from "zod";

/** Same bounds as better-auth's emailAndPassword options in lib/auth/auth.ts. */
export const PASSWORD_MIN = 10;
export const PASSWORD_MAX = 128;

export const passwordSchema = z
  .string({ error: "Choose a password." })
  .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters.`)
  .max(PASSWORD_MAX, `Use at most ${PASSWORD_MAX} characters.`);

const token = z.string().trim().regex(/^[A-Za-z0-9_-]{20,128}$/, "This link is not complete. Open it again from the e-mail.");

export const acceptInvitationSchema = z
  .object({ token, password: passwordSchema, confirmPassword: z.string() })
  .refine((v) => v.password === v.confirmPassword, { path: ["confirmPassword"], message: "The two passwords differ." });
export type AcceptInvitationInput = z.input<typeof acceptInvitationSchema>;

export const requestNewInvitationSchema = z.object({ token });

export const resetPasswordSchema = z
  .object({ password: passwordSchema, confirmPassword: z.string() })
  .refine((v) => v.password === v.confirmPassword, { path: ["confirmPassword"], message: "The two passwords differ." });

export const forgotPasswordSchema = z.object({ email: z.string().trim().pipe(z.email("Enter a valid e-mail address.")) });

/** An invitation link stays valid for a week and works once. */
export const INVITATION_TTL_DAYS = 7;
