/**
 * npm run backup — the database (mariadb-dump --single-transaction: one consistent snapshot,
 * no table locks, the app keeps working) and every stored object into one dated archive,
 * kalibore-<database>-<UTC time>.tar.gz in BACKUP_DIR (default backups/), with manifest.json and
 * SHA256SUMS (SHA-256 of every file). The database is dumped first, the objects after: a photo
 * row always comes after its object (lib/photos), so every object the dump names is copied.
 */
import { GetObjectCommand, ListObjectsV2Command } from "@aws-sdk/client-s3";
import { createWriteStream } from "node:fs";
import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { pipeline } from "node:stream/promises";
import type { Readable } from "node:stream";
import { parseServerEnv } from "../lib/env";
import { bucket, s3 } from "../lib/storage/s3";
import { clientOptionFile, run, sha256File, sha256sums, type BackupManifest } from "./lib/backup-archive";

const env = parseServerEnv(process.env);
const outDir = path.resolve(process.env.BACKUP_DIR || "backups");
const stamp = new Date().toISOString().replace(/[-:]/g, "").replace(/\.\d+Z$/, "Z");
const name = `kalibore-${env.DB_NAME}-${stamp}`;
const work = await fs.mkdtemp(path.join(os.tmpdir(), "kalibore-backup-"));
const root = path.join(work, name);
await fs.mkdir(path.join(root, "objects"), { recursive: true });

const cnf = await clientOptionFile(env);
try {
  const dumpFile = path.join(root, "database.sql");
  await run(
    "mariadb-dump",
    [`--defaults-extra-file=${cnf.file}`, "--single-transaction", "--quick", "--hex-blob", "--routines", "--no-tablespaces", "--default-character-set=utf8mb4", env.DB_NAME],
    { stdoutFile: dumpFile },
  );
  const server = (await run("mariadb", [`--defaults-extra-file=${cnf.file}`, "-N", "-B", "-e", "SELECT VERSION()"])).trim();

  const objects: BackupManifest["objects"] = [];
  let token: string | undefined;
  do {
    const page = await s3.send(new ListObjectsV2Command({ Bucket: bucket, ContinuationToken: token }));
    for (const item of page.Contents ?? []) {
      const file = `objects/${String(objects.length + 1).padStart(6, "0")}`;
      const got = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: item.Key! }));
      await pipeline(got.Body as Readable, createWriteStream(path.join(root, file)));
      const target = path.join(root, file);
      objects.push({ key: item.Key!, file, bytes: (await fs.stat(target)).size, sha256: await sha256File(target), contentType: got.ContentType ?? null });
    }
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);

  const manifest: BackupManifest = {
    format: "kalibore-backup/1",
    createdAt: new Date().toISOString(),
    database: { name: env.DB_NAME, file: "database.sql", bytes: (await fs.stat(dumpFile)).size, sha256: await sha256File(dumpFile), server },
    bucket,
    objects,
  };
  await fs.writeFile(path.join(root, "manifest.json"), JSON.stringify(manifest, null, 2));
  const listed = [{ file: "manifest.json", sha256: await sha256File(path.join(root, "manifest.json")) }, manifest.database, ...objects];
  await fs.writeFile(path.join(root, "SHA256SUMS"), sha256sums(listed));

  await fs.mkdir(outDir, { recursive: true });
  const archive = path.join(outDir, `${name}.tar.gz`);
  await run("tar", ["-czf", `${archive}.part`, "-C", work, name]);
  await fs.rename(`${archive}.part`, archive);
  const mb = (manifest.database.bytes + objects.reduce((s, o) => s + o.bytes, 0)) / 1048576;
  console.log(`backup written: ${archive}`);
  console.log(`  database ${env.DB_NAME} (${(manifest.database.bytes / 1048576).toFixed(1)} MB of SQL), ${objects.length} objects of bucket ${bucket}; ${mb.toFixed(1)} MB before compression`);
} finally {
  await cnf.remove();
  await fs.rm(work, { recursive: true, force: true });
}
