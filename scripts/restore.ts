/**
 * npm run restore ARCHIVE — puts a backup (npm run backup) into an EMPTY instance: a database with
 * no tables and a bucket with no objects; anything else is refused before a byte is written, so a
 * restore can never mix two fleets' records. Every file's SHA-256 is checked against the archive's
 * manifest first, and the restored objects against it again after upload. Then the app user's
 * table grants are given as after a migration (the audit trail append-only).
 */
import { CreateBucketCommand, HeadBucketCommand, ListObjectsV2Command, PutObjectCommand } from "@aws-sdk/client-s3";
import { createReadStream } from "node:fs";
import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import knex from "knex";
import { parseServerEnv } from "../lib/env";
import { bucket, s3 } from "../lib/storage/s3";
import { appUserHosts, grantAppUser } from "./lib/app-grants";
import { clientOptionFile, ownerCredentials, run, sha256File, type BackupManifest } from "./lib/backup-archive";

class Refused extends Error {}
function refuse(message: string): never {
  throw new Refused(message);
}

const archive = process.argv[2];
if (!archive) {
  console.error("restore refused: name the archive: npm run restore backups/kalibore-….tar.gz");
  process.exit(1);
}
if (!(await fs.stat(archive).catch(() => null))?.isFile()) {
  console.error(`restore refused: no such file: ${archive}`);
  process.exit(1);
}
const env = parseServerEnv(process.env);

const work = await fs.mkdtemp(path.join(os.tmpdir(), "kalibore-restore-"));
const cnf = await clientOptionFile(env);
const { user, password } = ownerCredentials(env);
const db = knex({ client: "mysql2", connection: { host: env.DB_HOST, port: env.DB_PORT, user, password, database: env.DB_NAME }, pool: { min: 0, max: 1 } });
try {
  await run("tar", ["-xzf", path.resolve(archive), "-C", work, "--no-same-owner"]);
  const [top] = await fs.readdir(work);
  const root = path.join(work, top ?? "");
  const manifest = JSON.parse(await fs.readFile(path.join(root, "manifest.json"), "utf8").catch(() => refuse("the archive has no manifest.json"))) as BackupManifest;
  if (manifest.format !== "kalibore-backup/1") refuse(`unknown archive format ${String(manifest.format)}`);

  // 1. Every file as it was written: nothing is restored from a damaged archive.
  for (const entry of [manifest.database, ...manifest.objects]) {
    if (!/^(database\.sql|objects\/\d{6})$/.test(entry.file)) refuse(`unexpected file name in the manifest: ${entry.file}`);
    const actual = await sha256File(path.join(root, entry.file)).catch(() => null);
    if (actual !== entry.sha256) refuse(`${entry.file} does not match its checksum in the manifest (damaged or altered archive)`);
  }

  // 2. Only into an empty instance.
  const tables = await db("information_schema.TABLES").where({ TABLE_SCHEMA: env.DB_NAME }).count<{ n: number }[]>({ n: "*" });
  if (Number(tables[0].n) > 0) refuse(`database ${env.DB_NAME} on ${env.DB_HOST}:${env.DB_PORT} already has ${tables[0].n} tables; restore into an empty database`);
  const bucketExists = await s3.send(new HeadBucketCommand({ Bucket: bucket })).then(() => true, () => false);
  if (bucketExists) {
    const listed = await s3.send(new ListObjectsV2Command({ Bucket: bucket, MaxKeys: 1 }));
    if ((listed.KeyCount ?? 0) > 0) refuse(`bucket ${bucket} already holds objects; restore into an empty bucket`);
  } else {
    await s3.send(new CreateBucketCommand({ Bucket: bucket }));
  }

  // 3. The database, then the objects, each checked once more as stored.
  await run("mariadb", [`--defaults-extra-file=${cnf.file}`, "--default-character-set=utf8mb4", env.DB_NAME], { stdinFile: path.join(root, manifest.database.file) });
  for (const o of manifest.objects) {
    const file = path.join(root, o.file);
    await s3.send(new PutObjectCommand({ Bucket: bucket, Key: o.key, Body: createReadStream(file), ContentLength: o.bytes, ContentType: o.contentType ?? undefined }));
  }
  if (env.DB_MIGRATION_USER && env.DB_MIGRATION_USER !== env.DB_USER) {
    await grantAppUser(db, { database: env.DB_NAME, appUser: env.DB_USER, hosts: appUserHosts() });
  }
  const restoredTables = await db("information_schema.TABLES").where({ TABLE_SCHEMA: env.DB_NAME }).count<{ n: number }[]>({ n: "*" });
  console.log(`restored ${path.basename(archive)} (taken ${manifest.createdAt}) into ${env.DB_NAME} on ${env.DB_HOST}:${env.DB_PORT}: ${restoredTables[0].n} tables; ${manifest.objects.length} objects into bucket ${bucket}`);
} catch (err) {
  console.error(err instanceof Refused ? `restore refused: ${err.message}` : err);
  process.exitCode = 1;
} finally {
  await db.destroy();
  await cnf.remove();
  await fs.rm(work, { recursive: true, force: true });
}
