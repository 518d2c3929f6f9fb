import "server-only";
import type { Knex } from "knex";
import { db as defaultDb } from "@/lib/db/knex";
import type { MailContent } from "./templates";
import { sendMail } from "./transport";

/*
 * The outbox: mail is written to `mail_outbox` inside the request and sent afterwards by
 * a small sender in the same process, so an answer never waits on the mail server (a
 * password-reset answer took ten times longer for a known address, which told an attacker
 * the address exists). A failed send is retried with a growing pause, its error kept; after
 * MAX_ATTEMPTS it stays `failed` (gave up) for someone to look at. A permanent refusal by the
 * receiving server (an SMTP 5xx answer: no such mailbox, address rejected) is a bounce: it is
 * marked `failed` at once and never retried, since sending again cannot help. The sender also
 * runs every SWEEP_MS, which picks up mail queued just before a restart.
 */
export const MAX_ATTEMPTS = 8;
const SWEEP_MS = 60_000;
const BATCH = 20;
/** A mail claimed this long ago and still "sending" belonged to a process that died: send it again. */
const LEASE_MS = 10 * 60_000;

export type OutboxMail = MailContent & {
  to: string;
  /** What the mail is, e.g. "password_reset" (for the log and for later digests). */
  kind: string;
  /** Mail that must go at most once (an alert, a digest) names itself here; a repeat is ignored. */
  dedupeKey?: string | null;
  /** The person it is for (when the address belongs to an account): who may see it listed. */
  userId?: string | null;
  /** The vessel it is about: people of that vessel may see it listed. */
  vesselId?: number | null;
  /** The page it links to (a path on APP_URL), for the notifications page. */
  linkPath?: string | null;
};

/** Transactions whose commit will wake the sender (one hook per transaction). */
const kickOnCommit = new WeakSet<object>();

/**
 * Queues one mail and wakes the sender; false when `dedupeKey` was queued before. Inside a
 * transaction the mail commits or rolls back with the change that caused it, and the sender
 * is woken once the transaction has committed (never before: the row is not visible yet).
 */
export async function queueMail(mail: OutboxMail, db: Knex | Knex.Transaction = defaultDb): Promise<boolean> {
  const [result] = (await db.raw(
    "INSERT IGNORE INTO mail_outbox (to_address, user_id, vessel_id, subject, text_body, html_body, kind, link_path, dedupe_key) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)",
    [mail.to, mail.userId ?? null, mail.vesselId ?? null, mail.subject, mail.text, mail.html ?? null, mail.kind, mail.linkPath ?? null, mail.dedupeKey ?? null],
  )) as [{ affectedRows: number }];
  if ("isTransaction" in db && db.isTransaction) {
    const trx = db as Knex.Transaction;
    if (!kickOnCommit.has(trx) && trx.executionPromise) {
      kickOnCommit.add(trx);
      // A rolled-back transaction queued nothing; the periodic sweep covers anything missed.
      trx.executionPromise.then(() => kickOutbox(), () => undefined);
    }
  } else kickOutbox();
  return result.affectedRows === 1;
}

/**
 * Whether a send error is a permanent refusal (SMTP reply 5xx, RFC 5321 §4.2.1: "permanent
 * negative completion"): a bounce, not worth retrying. Connection errors and 4xx answers are
 * temporary.
 */
export function isPermanentFailure(err: unknown): boolean {
  const code = (err as { responseCode?: unknown } | null)?.responseCode;
  return typeof code === "number" && code >= 500 && code < 600;
}

/** Seconds to wait before attempt n+1 after n failed attempts: 30 s, 1 min, 2 min … 1 h. */
export function retryDelayS(attempts: number): number {
  return Math.min(3600, 30 * 2 ** Math.max(0, attempts - 1));
}

type Send = (m: { to: string; subject: string; text: string; html: string }) => Promise<void>;

/**
 * Sends what is due, oldest first, and answers how many went. Each row is claimed with a
 * conditional update first (and leased for LEASE_MS), so two senders (two app instances)
 * do not send one mail twice.
 */
export async function drainOutbox(opts: { db?: Knex; send?: Send; now?: () => Date } = {}): Promise<number> {
  const db = opts.db ?? defaultDb;
  const send = opts.send ?? sendMail;
  const now = opts.now ?? (() => new Date());
  let sent = 0;
  for (;;) {
    const due = await db("mail_outbox")
      .whereIn("status", ["pending", "sending"])
      .andWhere("next_attempt_at", "<=", now())
      .orderBy("id")
      .limit(BATCH)
      .select("id", "to_address", "subject", "text_body", "html_body", "attempts");
    if (!due.length) return sent;
    for (const row of due) {
      const claimed = await db("mail_outbox")
        .where({ id: row.id, attempts: row.attempts })
        .whereIn("status", ["pending", "sending"])
        .update({ status: "sending", attempts: row.attempts + 1, next_attempt_at: new Date(now().getTime() + LEASE_MS) });
      if (claimed !== 1) continue;
      try {
        await send({ to: row.to_address, subject: row.subject, text: row.text_body, html: row.html_body ?? "" });
        await db("mail_outbox").where({ id: row.id }).update({ status: "sent", sent_at: now(), last_error: null });
        sent++;
      } catch (err) {
        const attempts = row.attempts + 1;
        const message = err instanceof Error ? err.message : String(err);
        const failure = isPermanentFailure(err) ? "bounced" : attempts >= MAX_ATTEMPTS ? "gave_up" : null;
        await db("mail_outbox")
          .where({ id: row.id })
          .update({
            status: failure ? "failed" : "pending",
            failure,
            last_error: message.slice(0, 2000),
            next_attempt_at: new Date(now().getTime() + retryDelayS(attempts) * 1000),
          });
        console.error(`mail ${row.id} not sent (attempt ${attempts}${failure ? `, ${failure}` : ""}):`, message);
      }
    }
  }
}

type SenderState = { running: Promise<void> | null; again: boolean; timer: ReturnType<typeof setInterval> | null };
const globalForOutbox = globalThis as unknown as { kaliboreOutbox?: SenderState };
const state: SenderState = (globalForOutbox.kaliboreOutbox ??= { running: null, again: false, timer: null });

/**
 * Wakes the sender without waiting for it: the caller's answer goes out first. One drain
 * runs at a time; a kick during a drain makes it look again when done.
 */
export function kickOutbox(): void {
  startOutboxSweep();
  if (state.running) {
    state.again = true;
    return;
  }
  state.running = new Promise<void>((resolve) => setImmediate(resolve))
    .then(async () => {
      do {
        state.again = false;
        await drainOutbox();
      } while (state.again);
    })
    .catch((err) => console.error("mail outbox:", err))
    .finally(() => {
      state.running = null;
    });
}

/** Starts the periodic sweep once per process (it does not keep the process alive). */
export function startOutboxSweep(): void {
  if (state.timer) return;
  state.timer = setInterval(kickOutbox, SWEEP_MS);
  state.timer.unref?.();
}

/** For tests and shutdown: resolves when the current drain (if any) has finished. */
export async function outboxIdle(): Promise<void> {
  while (state.running) await state.running;
}
