/*
 * Telling "a service Kalibore needs is down" from a fault in Kalibore: the database or the
 * object store refusing or dropping the connection is answered 503 with a sentence and a
 * Retry-After, so a device keeps its copy and tries again, instead of a 500. No server
 * imports: the error shapes are mysql2's, Knex's and the AWS SDK's.
 */

/** Network-level codes: the other end is not there, went away, or did not answer in time. */
const NETWORK = new Set(["ECONNREFUSED", "ECONNRESET", "ECONNABORTED", "EPIPE", "ETIMEDOUT", "EHOSTUNREACH", "ENETUNREACH", "EAI_AGAIN", "ENOTFOUND"]);
/** mysql2's codes for a server that is gone or shutting down, or too busy to take the connection. */
const DATABASE = new Set(["PROTOCOL_CONNECTION_LOST", "PROTOCOL_SEQUENCE_TIMEOUT", "ER_SERVER_SHUTDOWN", "ER_CON_COUNT_ERROR", "ER_NORMAL_SHUTDOWN"]);

type ErrorLike = { code?: unknown; message?: unknown; name?: unknown; errno?: unknown; fatal?: unknown; $metadata?: unknown; $fault?: unknown; cause?: unknown; errors?: unknown };

export type Unavailable = "database" | "store";

/**
 * Which service an error says is unreachable, or null when the error is something else
 * (a bug, a refused value). Looks through `cause` and aggregated errors, where Node and the
 * AWS SDK put the socket error.
 */
export function unavailableService(err: unknown, depth = 0): Unavailable | null {
  if (!err || typeof err !== "object" || depth > 4) return null;
  const e = err as ErrorLike;
  const code = typeof e.code === "string" ? e.code : "";
  const fromStore = "$metadata" in e || "$fault" in e;
  // mysql2 marks errors that ended the connection as fatal (some, like a command sent on a closed connection, carry no code).
  if (e.name === "KnexTimeoutError" || DATABASE.has(code) || (e.fatal === true && !fromStore)) return "database";
  if (NETWORK.has(code) || e.name === "TimeoutError") return fromStore ? "store" : "database";
  // The AWS SDK wraps the socket error; a store answering 5xx is down for our purpose too.
  if (fromStore) {
    const status = (e.$metadata as { httpStatusCode?: number } | undefined)?.httpStatusCode;
    if (status && status >= 500) return "store";
  }
  for (const inner of [e.cause, ...(Array.isArray(e.errors) ? e.errors : [])]) {
    const found = unavailableService(inner, depth + 1);
    if (found) return fromStore ? "store" : found;
  }
  return null;
}

/** The sentence a person reads while a service is down. */
export function unavailableMessage(service: Unavailable): string {
  return service === "database"
    ? "The database cannot be reached just now; nothing was saved or changed. Anything typed on a gauging sheet stays on this device and is sent again when the server is back. Try again in a minute."
    : "The photo store cannot be reached just now; nothing was saved or changed. A photo stays waiting on this device and is sent again when the store is back. Try again in a minute.";
}

/** Seconds a client should wait before trying again. */
export const RETRY_AFTER_S = 10;
