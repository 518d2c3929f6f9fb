import "server-only";
import type { Knex } from "knex";

/**
 * Errors after which the server has rolled the whole transaction back, so running it again is
 * safe: an InnoDB deadlock, and on a Galera cluster a certification failure or a transaction
 * aborted by a replicated one (both reported as ER_LOCK_DEADLOCK), a node that is not yet or no
 * longer part of the primary component (ER_UNKNOWN_COM_ERROR "WSREP has not yet prepared node")
 * and a commit the cluster refused (ER_ERROR_DURING_COMMIT).
 */
const ROLLED_BACK_ERRNOS = new Set([1213, 1047, 1180]);

/** The connection went away: the transaction may or may not have been committed. */
const CONNECTION_LOST_CODES = new Set(["PROTOCOL_CONNECTION_LOST", "ECONNRESET", "ECONNREFUSED", "EPIPE", "ETIMEDOUT", "ER_SERVER_SHUTDOWN"]);

export type RetryOptions = {
  /**
   * The work recognises its own earlier success (a client token, a same-value duplicate), so it
   * may run again even after a connection was lost while its commit was under way.
   */
  idempotent?: boolean;
  /** Runs in all, first included (default 5). */
  attempts?: number;
};

const errno = (err: unknown) => (err as { errno?: number } | null)?.errno;
const code = (err: unknown) => (err as { code?: string } | null)?.code;

/** True when `err` says the transaction was rolled back by the server and may simply run again. */
export function isRetryableTransactionError(err: unknown): boolean {
  const n = errno(err);
  return (n !== undefined && ROLLED_BACK_ERRNOS.has(n)) || /\bWSREP\b/.test((err as Error | null)?.message ?? "");
}

/**
 * True when the connection was lost, so whether the transaction committed is not known. mysql2
 * marks every error that leaves the connection unusable `fatal` (knex then reports the failed
 * ROLLBACK on the closed connection rather than the loss itself).
 */
export function isConnectionLost(err: unknown): boolean {
  const c = code(err);
  return (
    (err as { fatal?: boolean } | null)?.fatal === true ||
    (c !== undefined && CONNECTION_LOST_CODES.has(c)) ||
    errno(err) === 2013 ||
    errno(err) === 2006
  );
}

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/**
 * The one way mutations open a transaction: `fn` runs in a transaction, and when the server rolls it
 * back for a reason of its own (a deadlock, a Galera certification conflict, a node leaving the
 * cluster) it runs again on a fresh connection, after a short growing pause, up to `attempts`
 * times. A lost connection is retried when no statement of `fn` had run (nothing can have been
 * written) or when the work is `idempotent`; otherwise the error goes to the caller, who sees the
 * save refused and may repeat it. `fn` must keep its effects inside the transaction.
 */
export async function inTransaction<T>(db: Knex, fn: (trx: Knex.Transaction) => Promise<T>, opts: RetryOptions = {}): Promise<T> {
  const attempts = opts.attempts ?? 5;
  for (let attempt = 1; ; attempt++) {
    let started = false;
    try {
      return await db.transaction((trx) => {
        started = true;
        return fn(trx);
      });
    } catch (err) {
      const again = isRetryableTransactionError(err) || (isConnectionLost(err) && (!started || opts.idempotent === true));
      if (!again || attempt >= attempts) throw err;
      await pause(25 * 2 ** attempt + Math.random() * 50);
    }
  }
}
