import "server-only";
import { createHash } from "node:crypto";
import type { Knex } from "knex";
import { db as defaultDb } from "@/lib/db/knex";
import { inTransaction } from "@/lib/db/transaction";

/*
 * The per-account half of the sign-in limit (the per-address half is better-auth's rate
 * limiter). Every attempt on an account counts as a failure until it succeeds; after
 * FREE_FAILURES in a row each further attempt must wait twice as long as the last, up to
 * MAX_DELAY_S, from whatever address it comes. Unknown addresses are counted alike, so the
 * answer never tells whether an account exists. A successful sign-in or a password reset
 * starts the count afresh.
 */
export const SIGN_IN_THROTTLE = {
  freeFailures: 5,
  baseDelayS: 15,
  maxDelayS: 15 * 60,
  /** A count with no attempt for this long is forgotten. */
  forgetAfterS: 24 * 60 * 60,
} as const;

/** Seconds an account must rest after `failures` failed attempts in a row. */
export function delayAfterFailures(failures: number, rule = SIGN_IN_THROTTLE): number {
  if (failures < rule.freeFailures) return 0;
  return Math.min(rule.maxDelayS, rule.baseDelayS * 2 ** (failures - rule.freeFailures));
}

/** sha256 of the trimmed, lower-cased address (better-auth lower-cases e-mails too). */
export function accountKey(email: string): string {
  return createHash("sha256").update(email.trim().toLowerCase()).digest("hex");
}

export type Reservation = { allowed: true } | { allowed: false; retryAfterS: number };

/**
 * Counts one sign-in attempt on `email` before the password is checked, or refuses it
 * while the account rests. The row is locked for the decision, so a burst of parallel
 * attempts is counted one by one rather than all passing at once.
 */
export async function reserveSignInAttempt(email: string, now = new Date(), db: Knex = defaultDb): Promise<Reservation> {
  const key = accountKey(email);
  // The row is made outside the transaction: concurrent inserts inside it deadlock on the key.
  await db.raw("INSERT IGNORE INTO sign_in_throttle (account_key, failures, last_attempt_at) VALUES (?, 0, ?)", [key, now]);
  return inTransaction(db, async (trx) => {
    const row = await trx("sign_in_throttle").where({ account_key: key }).forUpdate().first("failures", "last_attempt_at");
    const last = new Date(row.last_attempt_at).getTime();
    const failures = now.getTime() - last > SIGN_IN_THROTTLE.forgetAfterS * 1000 ? 0 : Number(row.failures);
    const waitMs = last + delayAfterFailures(failures) * 1000 - now.getTime();
    if (failures > 0 && waitMs > 0) return { allowed: false, retryAfterS: Math.ceil(waitMs / 1000) };
    await trx("sign_in_throttle").where({ account_key: key }).update({ failures: failures + 1, last_attempt_at: now });
    return { allowed: true };
  });
}

/** After a successful sign-in or a password reset: the account starts afresh. */
export async function clearSignInFailures(email: string, db: Knex = defaultDb): Promise<void> {
  await db("sign_in_throttle").where({ account_key: accountKey(email) }).delete();
}
