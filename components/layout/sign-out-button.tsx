"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { authClient } from "@/lib/auth/auth-client";
import { forgetOfflinePages } from "./offline-support";

export function SignOutButton() {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  return (
    <button
      type="button"
      className="min-h-10 rounded-md px-3 text-sm text-paper/80 hover:bg-white/10 hover:text-paper"
      disabled={pending}
      onClick={async () => {
        setPending(true);
        await authClient.signOut();
        await forgetOfflinePages();
        router.replace("/sign-in");
        router.refresh();
      }}
    >
      {pending ? "Signing out…" : "Sign out"}
    </button>
  );
}
