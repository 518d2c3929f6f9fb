import "server-only";
import { createHash, timingSafeEqual } from "node:crypto";

/*
 * The scheduler's credential for /api/jobs/*: `Authorization: Bearer <JOBS_TOKEN>`. Compared in
 * constant time (both sides hashed first, so their lengths match and the time says nothing
 * about how much of the token was right). No token configured means no job can be started
 * over HTTP; `npm run digest` still works on the server itself.
 */

const digest = (s: string) => createHash("sha256").update(s, "utf8").digest();

/** Whether the request's Authorization header carries the configured token. */
export function jobTokenMatches(authorization: string | null, expected: string | undefined): boolean {
  if (!expected) return false;
  const m = /^Bearer ([\x21-\x7e]{1,512})$/.exec(authorization ?? "");
  const given = m ? m[1] : "";
  // Compare even a malformed header, so a missing token takes as long as a wrong one.
  const same = timingSafeEqual(digest(given), digest(expected));
  return m !== null && same;
}
