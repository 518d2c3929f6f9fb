"use client";

import { useEffect } from "react";
import { StatusPage } from "@/components/layout/status-page";
import { Button } from "@/components/ui/button";

// A page that failed to load (the database or the network away) says so plainly and offers a
// retry; nothing typed is lost, because entries are saved as they are typed.
export default function SignedInError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <StatusPage
      code="Could not load"
      title="This page did not load"
      action={
        <Button type="button" onClick={() => reset()}>
          Try again
        </Button>
      }
    >
      <p>
        The server could not answer just now. Anything already saved is safe. Try again in a moment; if it keeps failing,
        tell your administrator{error.digest ? " and quote the reference below" : ""}.
      </p>
      {error.digest ? <p className="num mt-3 font-mono text-sm">reference {error.digest}</p> : null}
    </StatusPage>
  );
}
