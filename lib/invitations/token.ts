import "server-only";
import { createHash, randomBytes } from "node:crypto";

/** A fresh invitation token (256 bits, URL-safe); only its hash is stored. */
export function newInvitationToken(): string {
  return randomBytes(32).toString("base64url");
}

/** SHA-256 hex of a token, the form kept in `invitations.token_hash`. */
export function hashInvitationToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}
