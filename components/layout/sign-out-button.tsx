"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { forgetAllWaitingPhotos, listWaitingPhotos } from "@/lib/photos/offline-queue";
import { forgetOfflinePages } from "./offline-support";

export function SignOutButton() {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  return (
    <button
      type="button"
      className="min-h-11 min-w-11 rounded-md px-3 text-sm text-paper/80 hover:bg-white/10 hover:text-paper"
      disabled={pending}
      onClick={async () => {
        // A shared tablet keeps no one's photos: say so before deleting ones not yet uploaded.
        const waiting = (await listWaitingPhotos()).length;
        if (
          waiting &&
          !window.confirm(
            `${waiting} photo${waiting === 1 ? " has" : "s have"} not been uploaded yet (taken without a network). Signing out deletes ${waiting === 1 ? "it" : "them"} from this device. Sign out anyway?`,
          )
        )
          return;
        setPending(true);
        // better-auth's own endpoint, called directly: its client library would ride in every page's first load.
        await fetch("/api/auth/sign-out", { method: "POST", headers: { "content-type": "application/json" }, body: "{}", credentials: "same-origin" }).catch(() => undefined);
        await forgetOfflinePages();
        await forgetAllWaitingPhotos();
        router.replace("/sign-in");
        router.refresh();
      }}
    >
      {pending ? "Signing out…" : "Sign out"}
    </button>
  );
}
