import { isIP } from "node:net";

/*
 * Which address a request comes from, for the sign-in limits and the session record.
 * Next.js keeps an X-Forwarded-For header the client sent itself, so trusting that header
 * let anyone pick a fresh address per attempt. Kalibore's server (scripts/serve.ts) writes
 * the address into its own header on every request, overwriting whatever the client sent:
 * the socket's peer by default, or the last entry of the proxy header named in
 * TRUSTED_PROXY_HEADER when the app sits behind a proxy that sets it.
 */

/** The request header scripts/serve.ts fills in; anything a client sends under this name is replaced. */
export const CLIENT_ADDRESS_HEADER = "x-kalibore-client-address";

const SERVED = Symbol.for("kalibore.client-address-stamped");

/** Called by the server before it handles any request: from now on the header above can be trusted. */
export function markClientAddressStamped(): void {
  (globalThis as Record<symbol, unknown>)[SERVED] = true;
}

/** Whether this process is served by scripts/serve.ts (else the header could come from the client). */
export function clientAddressStamped(): boolean {
  return (globalThis as Record<symbol, unknown>)[SERVED] === true;
}

/** "::ffff:192.0.2.1" → "192.0.2.1"; anything that is not an IP address → null. */
export function normaliseAddress(value: string | undefined | null): string | null {
  if (!value) return null;
  let v = value.trim();
  if (v.startsWith("[") && v.endsWith("]")) v = v.slice(1, -1);
  if (/^::ffff:\d+\.\d+\.\d+\.\d+$/i.test(v)) v = v.slice(7);
  return isIP(v) ? v.toLowerCase() : null;
}

type HeaderBag = Record<string, string | string[] | undefined>;

/**
 * The client's address: the socket peer, unless `trustedHeader` is configured, in which
 * case the last address in that header (the one the nearest proxy added; earlier entries
 * are whatever the client claimed). Falls back to the socket when the header is missing or
 * not an address, so a bad header never merges every client into one bucket.
 */
export function clientAddressOf(socketAddress: string | undefined, headers: HeaderBag, trustedHeader: string | null | undefined): string | null {
  const socket = normaliseAddress(socketAddress);
  if (!trustedHeader) return socket;
  const raw = headers[trustedHeader.toLowerCase()];
  const value = Array.isArray(raw) ? raw.join(",") : raw;
  const last = value?.split(",").map((s) => s.trim()).filter(Boolean).at(-1);
  return normaliseAddress(last) ?? socket;
}

/** Writes the client's address into CLIENT_ADDRESS_HEADER, replacing any value the client sent. */
export function stampClientAddress(req: { headers: HeaderBag; socket: { remoteAddress?: string } }, trustedHeader: string | null | undefined): void {
  const address = clientAddressOf(req.socket.remoteAddress, req.headers, trustedHeader);
  if (address) req.headers[CLIENT_ADDRESS_HEADER] = address;
  else delete req.headers[CLIENT_ADDRESS_HEADER];
}
