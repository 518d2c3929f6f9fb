"use client";

import { cn } from "@/lib/utils";
import type { SaveStatus } from "./use-draft-autosave";

const time = (iso: string | null) => (iso ? new Date(iso).toLocaleTimeString("en-GB", { hour: "2-digit", minute: "2-digit" }) : "");

/** Where the typed readings are: on the server, on the way, or only on this device — always in words. */
export function SaveStatusBadge({ status, invalidCount }: { status: SaveStatus; invalidCount: number }) {
  let icon = "✓";
  let text: string;
  let tone = "text-steady";
  switch (status.kind) {
    case "saved":
      text = `Saved${status.at ? ` ${time(status.at)}` : ""}`;
      break;
    case "pending":
      icon = "…";
      text = "Changes kept on this device, saving shortly";
      tone = "text-ink-soft";
      break;
    case "saving":
      icon = "↻";
      text = "Saving…";
      tone = "text-ink-soft";
      break;
    case "offline":
      icon = "⌁";
      text = "Offline — kept on this device";
      tone = "text-ink";
      break;
    case "conflict":
      icon = "⚠";
      text = "Not saved: changed elsewhere — choose below";
      tone = "text-caution";
      break;
    case "refused":
      icon = "⚠";
      text = `Kept on this device; the server refused: ${status.message}`;
      tone = "text-caution";
      break;
  }
  return (
    <p role="status" aria-live="polite" data-save-status={status.kind} className={cn("flex items-center gap-2 text-sm font-medium", tone)}>
      <span aria-hidden="true" className="inline-block w-4 text-center">
        {icon}
      </span>
      <span>
        {text}
        {invalidCount > 0 ? <span className="text-caution"> · {invalidCount} field{invalidCount === 1 ? "" : "s"} not a number (kept here only)</span> : null}
      </span>
    </p>
  );
}
