/**
 * Local stand-ins for the object store and the mail server, on loopback only:
 * s3rver (S3-compatible, files under S3_DIR) and an SMTP capture that writes each
 * message as an .eml file under MAIL_DIR. The app talks to them with the same code
 * it uses for real S3/MinIO and SMTP.
 */
import fs from "node:fs";
import path from "node:path";
import S3rver from "s3rver";
import { SMTPServer } from "smtp-server";

const s3Port = Number(process.env.S3_FAKE_PORT ?? 4569);
const smtpPort = Number(process.env.SMTP_FAKE_PORT ?? 2525);
const s3Dir = path.resolve(process.env.S3_FAKE_DIR ?? ".data/s3");
const mailDir = path.resolve(process.env.MAIL_FAKE_DIR ?? ".data/mail");
const bucket = process.env.S3_BUCKET ?? "kalibore";

fs.mkdirSync(s3Dir, { recursive: true });
fs.mkdirSync(mailDir, { recursive: true });

const s3 = new S3rver({
  address: "127.0.0.1",
  port: s3Port,
  directory: s3Dir,
  silent: true,
  configureBuckets: [{ name: bucket, configs: [corsConfig()] }],
});

function corsConfig(): string {
  // Browsers upload photos straight to the store with presigned PUTs.
  return `<CORSConfiguration><CORSRule><AllowedOrigin>*</AllowedOrigin><AllowedMethod>GET</AllowedMethod><AllowedMethod>PUT</AllowedMethod><AllowedMethod>HEAD</AllowedMethod><AllowedHeader>*</AllowedHeader><ExposeHeader>ETag</ExposeHeader><MaxAgeSeconds>3000</MaxAgeSeconds></CORSRule></CORSConfiguration>`;
}

let counter = 0;
const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  logger: false,
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
console.log(`[fakes] S3 on http://127.0.0.1:${s3Port} (bucket ${bucket}, files in ${s3Dir}); SMTP on 127.0.0.1:${smtpPort} (mail in ${mailDir})`);

async function shutdown() {
  await Promise.allSettled([s3.close(), new Promise<void>((r) => smtp.close(() => r()))]);
  process.exit(0);
}
process.on("SIGTERM", shutdown);
process.on("SIGINT", shutdown);
