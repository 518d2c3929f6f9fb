import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { SignInForm } from "@/components/auth/sign-in-form";
import { safeNextPath } from "@/lib/auth/safe-next";
import { getCurrentUser } from "@/lib/auth/session";
import { serverEnv } from "@/lib/env";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string }> }) {
  const { next } = await searchParams;
  const safeNext = safeNextPath(next, serverEnv.APP_URL);
  if (await getCurrentUser()) redirect(safeNext);
  return (
    <div className="w-full max-w-md rounded-xl bg-paper p-6 text-ink shadow-2xl sm:p-8">
      <h1 className="text-2xl font-semibold">Sign in</h1>
      <p className="mt-1 text-sm text-ink-soft">Liner and ring wear records for your fleet.</p>
      <SignInForm next={safeNext} />
      <p className="mt-5 text-sm">
        <Link href="/forgot-password" className="font-medium text-signal hover:underline">Forgot your password?</Link>
      </p>
      <p className="mt-2 text-xs text-ink-faint">Accounts are created by invitation from your administrator.</p>
    </div>
  );
}
