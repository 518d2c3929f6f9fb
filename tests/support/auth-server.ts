import { createServer, request as httpRequest, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { markClientAddressStamped, stampClientAddress } from "@/lib/auth/client-address";

/*
 * A real HTTP server in front of the real /api/auth route handler, stamping the client's
 * address exactly as scripts/serve.ts does, so the sign-in limits are tested with real
 * sockets: Linux routes all of 127.0.0.0/8 to loopback, so a test connects from
 * 127.0.0.2, 127.0.0.3… to be different clients.
 */
export const APP = process.env.APP_URL ?? "http://localhost:3000";

export type AuthServer = { port: number; close: () => Promise<void> };

export async function startAuthServer(trustedHeader: string | null = null): Promise<AuthServer> {
  markClientAddressStamped();
  const { GET, POST } = await import("@/app/api/auth/[...all]/route");
  const server: Server = createServer(async (req, res) => {
    stampClientAddress(req, trustedHeader);
    const chunks: Buffer[] = [];
    for await (const c of req) chunks.push(c as Buffer);
    const headers = new Headers();
    for (const [k, v] of Object.entries(req.headers)) if (v !== undefined) headers.set(k, Array.isArray(v) ? v.join(", ") : v);
    const body = chunks.length ? Buffer.concat(chunks) : undefined;
    const response = await (req.method === "GET" ? GET : POST)(new Request(new URL(req.url ?? "/", APP), { method: req.method, headers, body }));
    res.writeHead(response.status, Object.fromEntries(response.headers));
    res.end(Buffer.from(await response.arrayBuffer()));
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  return { port: (server.address() as AddressInfo).port, close: () => new Promise((resolve) => server.close(() => resolve())) };
}

export type Answer = { status: number; headers: Record<string, string | string[] | undefined>; body: string };

/** One HTTP request to the test server from the loopback address `from`. */
export function call(
  server: AuthServer,
  method: string,
  path: string,
  o: { from?: string; body?: unknown; headers?: Record<string, string> } = {},
): Promise<Answer> {
  const payload = o.body === undefined ? undefined : JSON.stringify(o.body);
  return new Promise((resolve, reject) => {
    const req = httpRequest(
      {
        host: "127.0.0.1",
        port: server.port,
        method,
        path,
        localAddress: o.from ?? "127.0.0.1",
        headers: { origin: APP, ...(payload ? { "content-type": "application/json" } : {}), ...o.headers },
      },
      (res) => {
        let body = "";
        res.setEncoding("utf8");
        res.on("data", (c) => (body += c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body }));
      },
    );
    req.on("error", reject);
    req.end(payload);
  });
}
