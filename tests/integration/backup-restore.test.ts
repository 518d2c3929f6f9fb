import { spawn, spawnSync } from "node:child_process";
import { createHash } from "node:crypto";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { GetObjectCommand, ListObjectsV2Command, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import knex, { type Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { testDb } from "../support/db";

/**
 * npm run backup, then npm run restore into a fresh MariaDB (its own mariadbd and data folder)
 * and a fresh S3 fake: every table and every object must come back identical. A second restore
 * into the now non-empty instance, and a restore of an altered archive, are refused.
 */
const ROOT = process.cwd();
const WORK = path.join(process.env.TEST_DATA_DIR ?? path.join(ROOT, ".test-data"), "backup-restore");
const APP = { user: "kalibore_restored_app", password: "restored-app-pw" };
const OWNER = { user: "kalibore_restored_owner", password: "restored-owner-pw" };
const TARGET_DB = "kalibore_restored";
const TARGET_BUCKET = "kalibore-restored";

const freePort = () =>
  new Promise<number>((resolve, reject) => {
    const s = net.createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });

const s3For = (endpoint: string) =>
  new S3Client({
    endpoint,
    region: process.env.S3_REGION ?? "us-east-1",
    forcePathStyle: true,
    credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID || "S3RVER", secretAccessKey: process.env.S3_SECRET_ACCESS_KEY || "S3RVER" },
  });

function runScript(script: string, args: string[], env: Record<string, string>): { code: number; out: string } {
  const r = spawnSync("node", ["--conditions=react-server", "--import", "tsx", script, ...args], { cwd: ROOT, env: { ...process.env, ...env }, encoding: "utf8", timeout: 120_000 });
  return { code: r.status ?? -1, out: `${r.stdout}${r.stderr}` };
}

/** Every row of every table, as one checksum per table (rows sorted, so storage order does not matter). */
async function tableChecksums(db: Knex, database: string): Promise<Record<string, { rows: number; sha256: string }>> {
  const tables = (await db("information_schema.TABLES").where({ TABLE_SCHEMA: database }).orderBy("TABLE_NAME").pluck("TABLE_NAME")) as string[];
  const out: Record<string, { rows: number; sha256: string }> = {};
  for (const t of tables) {
    const rows = (await db(t).select("*")).map((r) => JSON.stringify(r, (_k, v) => (Buffer.isBuffer(v) ? v.toString("hex") : v))).sort();
    out[t] = { rows: rows.length, sha256: createHash("sha256").update(rows.join("\n")).digest("hex") };
  }
  return out;
}

async function objectChecksums(s3: S3Client, bucket: string): Promise<Record<string, { sha256: string; type: string | undefined }>> {
  const out: Record<string, { sha256: string; type: string | undefined }> = {};
  let token: string | undefined;
  do {
    const page = await s3.send(new ListObjectsV2Command({ Bucket: bucket, ContinuationToken: token }));
    for (const o of page.Contents ?? []) {
      const got = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: o.Key! }));
      out[o.Key!] = { sha256: createHash("sha256").update(await got.Body!.transformToByteArray()).digest("hex"), type: got.ContentType };
    }
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
  return out;
}

describe("backup and restore", () => {
  let source: Knex;
  let target: Knex;
  let targetEnv: Record<string, string>;
  let archive: string;
  let fake: ReturnType<typeof spawn> | undefined;
  let targetS3: S3Client;
  const sourceS3 = s3For(process.env.S3_ENDPOINT!);
  const mariadbDir = path.join(WORK, "mariadb");

  beforeAll(async () => {
    fs.rmSync(WORK, { recursive: true, force: true });
    fs.mkdirSync(WORK, { recursive: true });
    source = testDb();
    // Something in each kind of store: an audit row and two objects (one under a nested key).
    await source("audit_log").insert({ action: "test.backup_marker", entity_type: "test", entity_id: "backup", detail: JSON.stringify({ text: "ünïcödé — 'quoted' \"twice\"" }) });
    const bucket = process.env.S3_BUCKET!;
    await sourceS3.send(new PutObjectCommand({ Bucket: bucket, Key: "backup-test/a.png", Body: Buffer.from([0x89, 0x50, 0x4e, 0x47, 0, 1, 2, 3]), ContentType: "image/png" }));
    await sourceS3.send(new PutObjectCommand({ Bucket: bucket, Key: "backup-test/nested/b.txt", Body: "second object", ContentType: "text/plain" }));

    const backup = runScript("scripts/backup.ts", [], { BACKUP_DIR: path.join(WORK, "archives") });
    expect(backup.code, backup.out).toBe(0);
    archive = /backup written: (\S+)/.exec(backup.out)![1];

    // A fresh instance: its own mariadbd in a new data folder, and a fresh S3 fake.
    const dbPort = await freePort();
    const started = spawnSync("bash", ["-c", `source scripts/lib/common.sh; start_mariadb "$0" "$1" ${TARGET_DB} ${APP.user} ${APP.password} ${OWNER.user} ${OWNER.password} >"$0.log" 2>&1`, mariadbDir, String(dbPort)], { cwd: ROOT, stdio: "ignore", timeout: 60_000 });
    expect(started.status, fs.existsSync(`${mariadbDir}.log`) ? fs.readFileSync(`${mariadbDir}.log`, "utf8") : "no log").toBe(0);
    const s3Port = await freePort();
    fake = spawn("node", ["--import", "tsx", "scripts/fakes.ts"], {
      cwd: ROOT,
      env: { ...process.env, S3_FAKE_PORT: String(s3Port), SMTP_FAKE_PORT: "0", S3_FAKE_DIR: path.join(WORK, "s3"), MAIL_FAKE_DIR: path.join(WORK, "mail"), S3_BUCKET: TARGET_BUCKET },
      stdio: "ignore",
    });
    targetS3 = s3For(`http://127.0.0.1:${s3Port}`);
    for (let i = 0; i < 100; i++) {
      if (await targetS3.send(new ListObjectsV2Command({ Bucket: TARGET_BUCKET })).then(() => true, () => false)) break;
      await new Promise((r) => setTimeout(r, 200));
    }
    targetEnv = {
      DB_PORT: String(dbPort),
      DB_NAME: TARGET_DB,
      DB_USER: APP.user,
      DB_PASSWORD: APP.password,
      DB_MIGRATION_USER: OWNER.user,
      DB_MIGRATION_PASSWORD: OWNER.password,
      S3_ENDPOINT: `http://127.0.0.1:${s3Port}`,
      S3_BUCKET: TARGET_BUCKET,
    };
    // Read as the source connection reads (tests/support/db.ts), or a decimal column compares as 900 against "900.000".
    target = knex({ client: "mysql2", connection: { host: "127.0.0.1", port: dbPort, user: OWNER.user, password: OWNER.password, database: TARGET_DB, timezone: "Z", dateStrings: ["DATE"] as unknown as boolean, decimalNumbers: true }, pool: { min: 0, max: 2 } });
  }, 180_000);

  afterAll(async () => {
    await source?.destroy();
    await target?.destroy();
    fake?.kill();
    const pidFile = path.join(mariadbDir, "run", "mysqld.pid");
    if (fs.existsSync(pidFile)) process.kill(Number(fs.readFileSync(pidFile, "utf8").trim()), "SIGTERM");
  });

  it("writes one dated archive whose manifest lists a SHA-256 for the dump and every object", () => {
    expect(path.basename(archive)).toMatch(/^kalibore-kalibore_it-\d{8}T\d{6}Z\.tar\.gz$/);
    const list = spawnSync("tar", ["-tzf", archive], { encoding: "utf8" }).stdout;
    expect(list).toMatch(/manifest\.json/);
    expect(list).toMatch(/SHA256SUMS/);
    expect(list).toMatch(/database\.sql/);
    // The checksum list is the one coreutils' sha256sum -c reads: an archive can be checked by hand at sea.
    const dir = path.join(WORK, "unpacked");
    fs.mkdirSync(dir, { recursive: true });
    spawnSync("tar", ["-xzf", archive, "-C", dir]);
    const [top] = fs.readdirSync(dir);
    const check = spawnSync("sha256sum", ["-c", "SHA256SUMS"], { cwd: path.join(dir, top), encoding: "utf8" });
    expect(check.status, check.stdout + check.stderr).toBe(0);
    expect(check.stdout).toMatch(/database\.sql: OK/);
  });

  it("restores into the empty instance: every table and every object identical", async () => {
    const restored = runScript("scripts/restore.ts", [archive], targetEnv);
    expect(restored.code, restored.out).toBe(0);
    const [before, after] = [await tableChecksums(source, process.env.DB_NAME ?? "kalibore_it"), await tableChecksums(target, TARGET_DB)];
    expect(Object.keys(after).length).toBeGreaterThan(15);
    const differing = Object.keys({ ...before, ...after }).filter((t) => JSON.stringify(before[t]) !== JSON.stringify(after[t]));
    if (differing.length) {
      // Say what differs: the first row of the first such table that is not in the restored copy.
      const t = differing[0];
      const key = (r: unknown) => JSON.stringify(r, (_k, v) => (Buffer.isBuffer(v) ? v.toString("hex") : v));
      const restored = new Set((await target(t).select("*")).map(key));
      const missing = (await source(t).select("*")).map(key).find((r) => !restored.has(r));
      expect(differing, `tables that differ after the restore; first unmatched row of ${t}: ${missing?.slice(0, 600)}`).toEqual([]);
    }
    expect(before.audit_log.rows).toBeGreaterThan(0);
    const [objectsBefore, objectsAfter] = [await objectChecksums(sourceS3, process.env.S3_BUCKET!), await objectChecksums(targetS3, TARGET_BUCKET)];
    expect(objectsAfter["backup-test/nested/b.txt"]).toBeDefined();
    expect(objectsAfter).toEqual(objectsBefore);
  });

  it("gives the restored instance's app user its grants: the audit trail stays append-only", async () => {
    const app = knex({ client: "mysql2", connection: { host: "127.0.0.1", port: Number(targetEnv.DB_PORT), user: APP.user, password: APP.password, database: TARGET_DB }, pool: { min: 0, max: 1 } });
    try {
      expect(await app("audit_log").where({ action: "test.backup_marker" }).first("id")).toBeDefined();
      await expect(app("audit_log").where({ action: "test.backup_marker" }).delete()).rejects.toMatchObject({ errno: 1142 });
    } finally {
      await app.destroy();
    }
  });

  it("refuses to restore into an instance that is not empty, and changes nothing", async () => {
    const before = await tableChecksums(target, TARGET_DB);
    const again = runScript("scripts/restore.ts", [archive], targetEnv);
    expect(again.code).toBe(1);
    expect(again.out).toMatch(/restore refused: database kalibore_restored .* already has \d+ tables/);
    expect(await tableChecksums(target, TARGET_DB)).toEqual(before);
  });

  it("refuses an archive whose files do not match the manifest's checksums", () => {
    const dir = path.join(WORK, "unpacked");
    const [top] = fs.readdirSync(dir);
    const dump = path.join(dir, top, "database.sql");
    fs.appendFileSync(dump, "\nINSERT INTO audit_log (action, entity_type, entity_id) VALUES ('forged', 'x', 'y');\n");
    const altered = path.join(WORK, "altered.tar.gz");
    spawnSync("tar", ["-czf", altered, "-C", dir, top]);
    const r = runScript("scripts/restore.ts", [altered], { ...targetEnv, DB_NAME: "kalibore_never_written" });
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/database\.sql does not match its checksum/);
  });
});
