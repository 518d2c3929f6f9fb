import Link from "next/link";
import { buttonClass } from "@/components/ui/button";
import { requireUser } from "@/lib/auth/session";
import { ROLE_LABELS } from "@/lib/auth/roles";

export default async function NoAccessPage() {
  const user = await requireUser();
  return (
    <div className="mx-auto max-w-lg py-12 text-center">
      <h1 className="text-2xl font-semibold">Not available to your role</h1>
      <p className="mt-3 text-ink-soft">
        You are signed in as {ROLE_LABELS[user.role].toLowerCase()}. This page or action belongs to another role, or to a
        vessel you are not assigned to. Ask your administrator if you think this is wrong.
      </p>
      <Link href="/" className={`${buttonClass("secondary")} mt-6`}>
        Back to start
      </Link>
    </div>
  );
}
