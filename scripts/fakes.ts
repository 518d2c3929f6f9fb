/**
 * Local stand-ins for the object store and the mail server, on loopback only:
 * s3rver (S3-compatible, files under S3_DIR) and an SMTP capture that writes each
 * message as an .eml file under MAIL_DIR. The app talks to them with the same code
 * it uses for real S3/MinIO and SMTP. The store behaves as a private bucket should
 * (scripts/lib/s3-fake-guard.ts): signed requests only, CORS for the app's origin only.
 */
import fs from "node:fs";
import path from "node:path";
import S3rver from "s3rver";
import { SMTPServer } from "smtp-server";
import { privateBucketGuard } from "./lib/s3-fake-guard";

const s3Port = Number(process.env.S3_FAKE_PORT ?? 4569);
const smtpPort = Number(process.env.SMTP_FAKE_PORT ?? 2525);
const s3Dir = path.resolve(process.env.S3_FAKE_DIR ?? ".data/s3");
const mailDir = path.resolve(process.env.MAIL_FAKE_DIR ?? ".data/mail");
const bucket = process.env.S3_BUCKET ?? "kalibore";
const accessKeyId = process.env.S3_ACCESS_KEY_ID || "S3RVER";
const secret = process.env.S3_SECRET_ACCESS_KEY || "S3RVER";

/** The app's address and its localhost/127.0.0.1 twin, plus any extra (the test server's). */
function appOrigins(): string[] {
  const app = new URL(process.env.APP_URL || "http://localhost:3000").origin;
  const twin = app.includes("//localhost") ? app.replace("//localhost", "//127.0.0.1") : app.replace("//127.0.0.1", "//localhost");
  const extra = (process.env.S3_FAKE_ALLOWED_ORIGINS ?? "").split(/[\s,]+/).filter(Boolean).map((o) => new URL(o).origin);
  return [...new Set([app, twin, ...extra])];
}
const origins = appOrigins();

fs.mkdirSync(s3Dir, { recursive: true });
fs.mkdirSync(mailDir, { recursive: true });

const s3 = new S3rver({
  address: "127.0.0.1",
  port: s3Port,
  directory: s3Dir,
  silent: true,
  configureBuckets: [{ name: bucket, configs: [corsConfig()] }],
});
// First in line, before s3rver's own middleware (Koa composes the list when it listens).
(s3 as unknown as { middleware: unknown[] }).middleware.unshift(privateBucketGuard({ accessKeyId, secret, allowedOrigins: origins }));

function corsConfig(): string {
  // Browsers upload photos straight to the store with presigned PUTs, from the app's pages only.
  const allowed = origins.map((o) => `<AllowedOrigin>${o}</AllowedOrigin>`).join("");
  return `<CORSConfiguration><CORSRule>${allowed}<AllowedMethod>GET</AllowedMethod><AllowedMethod>PUT</AllowedMethod><AllowedMethod>HEAD</AllowedMethod><AllowedHeader>content-type</AllowedHeader><ExposeHeader>ETag</ExposeHeader><MaxAgeSeconds>600</MaxAgeSeconds></CORSRule></CORSConfiguration>`;
}

let counter = 0;
const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  logger: false,
  // Addresses in the reserved .invalid domain (RFC 2606) are refused for good, as a real
  // server refuses an unknown mailbox (550 5.1.1), so a bounce can be tried locally.
  onRcptTo(address, _session, callback) {
    if (/\.invalid$/i.test(address.address)) {
      const err = Object.assign(new Error(`5.1.1 <${address.address}>: mailbox unavailable`), { responseCode: 550 });
      return callback(err);
    }
    callback();
  },
  onData(stream, session, callback) {
    const chunks: Buffer[] = [];
    stream.on("data", (c: Buffer) => chunks.push(c));
    stream.on("end", () => {
      const name = `${Date.now()}-${process.pid}-${++counter}.eml`;
      fs.writeFileSync(path.join(mailDir, name), Buffer.concat(chunks));
      callback();
    });
  },
});

await s3.run();
await new Promise<void>((resolve, reject) => {
  smtp.once("error", reject);
  smtp.listen(smtpPort, "127.0.0.1", () => resolve());
});
console.log(`[fakes] S3 on http://127.0.0.1:${s3Port} (bucket ${bucket}, private, CORS for ${origins.join(" ")}; files in ${s3Dir}); SMTP on 127.0.0.1:${smtpPort} (mail in ${mailDir})`);

async function shutdown() {
  await Promise.allSettled([s3.close(), new Promise<void>((r) => smtp.close(() => r()))]);
  process.exit(0);
}
process.on("SIGTERM", shutdown);
process.on("SIGINT", shutdown);
