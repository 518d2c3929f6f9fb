import type { Metadata } from "next";
import { StatusPage } from "@/components/layout/status-page";
import { Wordmark } from "@/components/ui/logo";

export const metadata: Metadata = { title: "Not found" };

// Addresses outside every route: no session is assumed, so no navigation is shown.
export default function NotFound() {
  return (
    <div className="min-h-dvh bg-paper px-4">
      <header className="mx-auto max-w-6xl py-5">
        <Wordmark />
      </header>
      <StatusPage code="Not found" title="No such page">
        <p>The address does not lead to a page of Kalibore. Check the link, or start again from the home page.</p>
      </StatusPage>
    </div>
  );
}
