import "server-only";
import { auth } from "./auth";
import { CLIENT_ADDRESS_HEADER, clientAddressStamped } from "./client-address";

/*
 * The HTTP face of better-auth, narrowed to what Kalibore's screens use. better-auth
 * serves many more endpoints; every one not listed here answers 404, so its admin
 * endpoints (impersonate, set-role, create-user, set-password, ban, remove-user…), its
 * session listing (which hands out the raw tokens of the user's other sessions) and
 * self-service account changes stay closed even if a future version adds more.
 */
const OPEN: Record<string, readonly string[]> = {
  GET: ["/get-session"],
  POST: ["/sign-in/email", "/sign-out", "/request-password-reset", "/reset-password"],
};

const BASE = "/api/auth";

/** The better-auth path of a request to /api/auth/…, e.g. "/sign-in/email". */
export function authPathOf(url: string): string {
  const { pathname } = new URL(url);
  return pathname.startsWith(BASE) ? pathname.slice(BASE.length).replace(/\/+$/, "") || "/" : pathname;
}

export function isOpenAuthEndpoint(method: string, path: string): boolean {
  return (OPEN[method.toUpperCase()] ?? []).includes(path);
}

const notFound = () => Response.json({ error: "Not found" }, { status: 404, headers: { "cache-control": "no-store" } });

/**
 * The request better-auth sees: the client-address header only when this process is served
 * by scripts/serve.ts (which overwrote whatever the client sent); under plain `next start`
 * it could be the client's own claim, so it is dropped.
 */
async function forwarded(req: Request): Promise<Request> {
  if (clientAddressStamped() || !req.headers.has(CLIENT_ADDRESS_HEADER)) return req;
  const headers = new Headers(req.headers);
  headers.delete(CLIENT_ADDRESS_HEADER);
  const body = req.method === "GET" || req.method === "HEAD" ? undefined : await req.arrayBuffer();
  return new Request(req.url, { method: req.method, headers, body, signal: req.signal });
}

/**
 * The session answer without its token: the cookie is httpOnly so scripts cannot read it, and neither
 * should this. Never stored by the browser or a proxy: a stored copy would outlive a sign-out.
 */
async function withoutToken(res: Response): Promise<Response> {
  if (!res.ok || !res.headers.get("content-type")?.includes("application/json")) return res;
  const body = (await res.json()) as { session?: Record<string, unknown> } | null;
  if (body?.session) delete body.session.token;
  const headers = new Headers(res.headers);
  headers.delete("content-length");
  headers.set("cache-control", "no-store");
  return new Response(JSON.stringify(body), { status: res.status, statusText: res.statusText, headers });
}

/** GET and POST /api/auth/* */
export async function handleAuthRequest(req: Request): Promise<Response> {
  const path = authPathOf(req.url);
  if (!isOpenAuthEndpoint(req.method, path)) return notFound();
  const res = await auth.handler(await forwarded(req));
  return path === "/get-session" ? withoutToken(res) : res;
}
