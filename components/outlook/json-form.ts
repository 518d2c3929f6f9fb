"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";

export type Outcome = { ok: boolean; text: string; field?: string } | null;

/**
 * Sends one JSON request for a small form and refreshes the page on success. A refusal keeps
 * what was typed (the form's own state is untouched) and reports the field the server named.
 */
export function useJsonSubmit() {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [outcome, setOutcome] = useState<Outcome>(null);
  async function send(method: string, url: string, body: unknown, done: string): Promise<boolean> {
    if (busy) return false;
    setBusy(true);
    setOutcome(null);
    try {
      const res = await fetch(url, { method, headers: { "content-type": "application/json" }, body: body === undefined ? undefined : JSON.stringify(body) });
      const answer = await res.json().catch(() => ({}));
      if (!res.ok) {
        setOutcome({ ok: false, text: answer?.error ?? "Not saved.", field: answer?.details?.field });
        return false;
      }
      setOutcome({ ok: true, text: done });
      router.refresh();
      return true;
    } catch {
      setOutcome({ ok: false, text: "No answer from the server; nothing was saved. Try again when the network is back." });
      return false;
    } finally {
      setBusy(false);
    }
  }
  return { busy, outcome, send };
}
