import { isTopic, TOPIC_INFO } from "@/lib/notifications/topics";

const OTHER_KINDS: Record<string, string> = {
  invitation: "Invitation",
  invitation_request: "New invitation asked for",
  password_reset: "Password reset",
};

/** A mail's kind in words, for the notifications list. */
export function kindLabel(kind: string): string {
  if (kind === "weekly_digest") return "Weekly digest";
  if (isTopic(kind)) return `Alert: ${TOPIC_INFO[kind].label.toLowerCase()}`;
  return OTHER_KINDS[kind] ?? kind.replace(/_/g, " ");
}

/** Pages an e-mail may link to that are worth opening from the list (not one-time links). */
export function openablePath(path: string | null): string | null {
  if (!path || !path.startsWith("/") || path.startsWith("//")) return null;
  return /^\/(invite|reset-password)/.test(path) ? null : path;
}
