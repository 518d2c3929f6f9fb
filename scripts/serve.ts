/**
 * The production web server: Next.js behind a plain Node HTTP server, so that every
 * request carries the client's address as the socket saw it (or as the configured proxy
 * header says). `next start` cannot do this: it keeps a client-sent X-Forwarded-For.
 * Used by `npm start`, `npm run serve` and the end-to-end tests.
 */
import { createServer } from "node:http";
import next from "next";
import { markClientAddressStamped, stampClientAddress } from "../lib/auth/client-address";

const port = Number(process.env.PORT ?? 3000);
const hostname = process.env.HOST ?? "127.0.0.1";
const trustedHeader = process.env.TRUSTED_PROXY_HEADER?.trim() || null;

markClientAddressStamped();
const app = next({ dev: false, dir: process.cwd(), hostname, port });
const handle = app.getRequestHandler();
await app.prepare();

const server = createServer((req, res) => {
  stampClientAddress(req, trustedHeader);
  void handle(req, res);
});
server.listen(port, hostname, () => {
  console.log(`Kalibore listening on http://${hostname}:${port}${trustedHeader ? ` (client address from ${trustedHeader})` : ""}`);
});
const stop = () => server.close(() => process.exit(0));
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
