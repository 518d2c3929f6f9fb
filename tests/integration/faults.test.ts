import fs, { readFileSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { createConnection, type Connection } from "mysql2/promise";
import { GET as getRoute, PUT as putRoute } from "@/app/api/inspections/[inspectionId]/route";
import { POST as approveRoute } from "@/app/api/inspections/[inspectionId]/approve/route";
import { POST as completeRoute } from "@/app/api/inspections/[inspectionId]/photos/complete/route";
import { POST as commitImportRoute } from "@/app/api/imports/[importId]/commit/route";
import { db } from "@/lib/db/knex";
import { drainOutbox, outboxIdle, queueMail } from "@/lib/mail/outbox";
import { objectSize } from "@/lib/photos/storage";
import { changedTables, snapshotTables } from "../support/fuzz";
import { p640Engine, previewHistory } from "../support/import-world";
import { draftOn, makeImage, submittedOn, uploadToSlot } from "../support/inspection-builders";
import { request } from "../support/matrix";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { DB_PORT, killMariadb, portOpen, S3_PORT, startFakes, startMariadb, stopFakes } from "../support/services";
import { signInCookie } from "../support/sessions";

/*
 * Faults against the real services on loopback: the test MariaDB killed (SIGKILL) while a
 * draft save and an approval with its recompute are half-way through their transaction,
 * then started again on the same data folder; the S3 and SMTP fakes stopped and started.
 * Afterwards nothing is half-written, while a service is down the API answers 503 in
 * words (not a 500), and the work goes through once it is back.
 */

let world: RoleWorld;
let units: number[] = [];
let engineerCookie = "";
let chiefCookie = "";
const person = (u: { id: string; name: string }) => ({ id: u.id, name: u.name });
const params = (id: number) => ({ params: Promise.resolve({ inspectionId: String(id) }) }) as never;
const SOCKET = path.join(process.env.TEST_DATA_DIR ?? ".test-data", "mariadb", "run", "mysqld.sock");
const TABLES = ["inspections", "liner_readings", "ring_readings", "checklist_entries", "audit_log", "unit_analysis", "stored_files", "inspection_photos", "gauge_imports"];
const others = async () => ((await db.raw("SHOW TABLES"))[0] as Record<string, string>[]).map((r) => Object.values(r)[0]).filter((t) => !TABLES.includes(t));

beforeAll(async () => {
  world = await buildRoleWorld(db, "faults");
  units = (await db("cylinder_units").where({ engine_id: world.engine1 }).orderBy("cylinder_no").select("id")).map((r) => r.id as number);
  engineerCookie = await signInCookie(world.users.engineer.email, WORLD_PASSWORD);
  chiefCookie = await signInCookie(world.users.chief.email, WORLD_PASSWORD);
}, 60_000);

afterAll(async () => {
  // Whatever happened above, leave the services running for the test files after this one.
  if (!(await portOpen(DB_PORT))) await startMariadb();
  if (!(await portOpen(S3_PORT))) await startFakes();
}, 90_000);

/**
 * A second connection that holds what the request under test needs late in its transaction
 * (`sql`: LOCK TABLES, or rows locked FOR UPDATE in an open transaction), so it stops half-way.
 */
async function hold(sql: string): Promise<Connection> {
  // As MariaDB's root over the socket: the app's user may not lock the audit trail (it may only add to it).
  const conn = await createConnection({ socketPath: SOCKET, user: "root", database: process.env.DB_NAME });
  conn.on("error", () => undefined);
  if (/FOR UPDATE/i.test(sql)) await conn.query("BEGIN");
  await conn.query(sql);
  return conn;
}

/**
 * Waits until a transaction has changed rows and is waiting for the held table: the request
 * is half-way. Asked as MariaDB's root over the socket (the app's user cannot see others' transactions).
 */
async function halfWay(): Promise<void> {
  const root = await createConnection({ socketPath: SOCKET, user: "root" });
  try {
    const until = Date.now() + 20_000;
    let stuck = new Set<number>();
    for (;;) {
      const [rows] = (await root.query(
        "SELECT t.trx_rows_modified AS modified, t.trx_state AS trx, p.STATE AS state FROM information_schema.INNODB_TRX t JOIN information_schema.PROCESSLIST p ON p.ID = t.trx_mysql_thread_id WHERE t.trx_rows_modified > 0",
      )) as unknown as [{ modified: number; trx: string; state: string }[]];
      if (rows.some((r) => r.trx === "LOCK WAIT" || /lock/i.test(r.state ?? ""))) return;
      // A statement of the request waiting on the held table, whatever InnoDB counts as modified so far:
      // the checks after the restart say whether anything of it stayed.
      const [waiting] = (await root.query(
        "SELECT p.ID FROM information_schema.PROCESSLIST p LEFT JOIN information_schema.INNODB_TRX t ON t.trx_mysql_thread_id = p.ID WHERE p.USER <> 'root' AND p.INFO IS NOT NULL AND (p.STATE LIKE '%lock%' OR p.STATE = 'Updating' OR t.trx_state = 'LOCK WAIT')",
      )) as unknown as [unknown[]];
      // Seen twice, 50 ms apart: the statement is stuck on the held rows, not merely running.
      const ids = (waiting as { ID: number }[]).map((w) => w.ID);
      if (ids.some((id) => stuck.has(id))) return;
      stuck = new Set(ids);
      if (Date.now() > until) {
        const [all] = await root.query("SELECT ID, USER, STATE, INFO FROM information_schema.PROCESSLIST WHERE USER <> 'root'");
        throw new Error(`no transaction stopped half-way: ${JSON.stringify(rows)} ${JSON.stringify(all)}`);
      }
      await new Promise((r) => setTimeout(r, 50));
    }
  } finally {
    await root.end().catch(() => undefined);
  }
}

/** A refusal while a service is down: 503, a sentence, no stack trace, and a hint to retry. */
async function expectUnavailable(res: Response, service: RegExp) {
  const text = await res.text();
  expect(res.status, text).toBe(503);
  const body = JSON.parse(text) as { error: string };
  expect(body.error).toMatch(service);
  expect(body.error).toMatch(/nothing was (saved|changed)/i);
  expect(text).not.toMatch(/\n\s+at |Error:|ECONNREFUSED|PROTOCOL_/);
  expect(res.headers.get("retry-after")).toMatch(/^\d+$/);
}

describe("MariaDB killed half-way through a request", () => {
  it("a draft save: nothing half-written, 503 while down, and the device's copy saves when it is back", async () => {
    const engineer = person(world.users.engineer);
    const d = await draftOn(units[0], engineer);
    const sent = structuredClone(d.draft);
    sent.readings = sent.readings.map((r) => ({ ...r, diameterMm: Math.round((r.diameterMm + 0.011) * 1000) / 1000 }));
    sent.header.crew = "2/E after the crash";
    const before = await snapshotTables(db, await others());

    // The save updates the record, replaces its readings and rings, then its checklist: it waits there.
    const held = await hold(`SELECT id FROM checklist_entries WHERE inspection_id = ${d.id} FOR UPDATE`);
    try {
      asCaller(engineerCookie);
      const saving = putRoute(request("PUT", `/api/inspections/${d.id}`, { revision: d.revision, draft: sent }), params(d.id));
      await halfWay();
      await killMariadb();
      await expectUnavailable(await saving, /database/i);
      // While it is down, reading answers the same way (not a 401: the session is not the problem).
      await expectUnavailable(await getRoute(request("GET", `/api/inspections/${d.id}`), params(d.id)), /database/i);
    } finally {
      held.destroy();
      if (!(await portOpen(DB_PORT))) await startMariadb();
    }

    expect(changedTables(before, await snapshotTables(db, await others())), "half-written rows after the crash").toEqual([]);
    // The device sends its copy again with the revision it had: it goes through.
    const again = await putRoute(request("PUT", `/api/inspections/${d.id}`, { revision: d.revision, draft: sent }), params(d.id));
    expect(again.status, await again.clone().text()).toBe(200);
    const back = (await (await getRoute(request("GET", `/api/inspections/${d.id}`), params(d.id))).json()) as { revision: number; draft: { header: { crew: string } } };
    expect(back.revision).toBe(d.revision + 1);
    expect(back.draft.header.crew).toBe("2/E after the crash");
  }, 120_000);

  it("an approval with its recompute: still submitted afterwards, no audit entry, the analysis untouched; approving again works", async () => {
    const s = await submittedOn(units[1], person(world.users.engineer));
    const before = await snapshotTables(db, await others());
    // The approval marks the record approved, then recomputes the unit's analysis: it waits there.
    const held = await hold("LOCK TABLES unit_analysis WRITE");
    try {
      asCaller(chiefCookie);
      const approving = approveRoute(request("POST", `/api/inspections/${s.id}/approve`, {}), params(s.id));
      await halfWay();
      await killMariadb();
      await expectUnavailable(await approving, /database/i);
    } finally {
      held.destroy();
      if (!(await portOpen(DB_PORT))) await startMariadb();
    }
    expect(changedTables(before, await snapshotTables(db, await others())), "half-written rows after the crash").toEqual([]);
    expect((await db("inspections").where({ id: s.id }).first("state")).state).toBe("submitted");

    const again = await approveRoute(request("POST", `/api/inspections/${s.id}/approve`, {}), params(s.id));
    expect(again.status, await again.clone().text()).toBe(200);
    expect((await db("inspections").where({ id: s.id }).first("state")).state).toBe("approved");
    expect(await db("unit_analysis").where({ unit_id: units[1] }).first("unit_id")).toBeDefined();
  }, 120_000);
});

describe("MariaDB killed half-way through an import", () => {
  it("the import's commit is all or nothing: no record of it afterwards, and it imports whole when committed again", async () => {
    const engineer = person(world.users.engineer);
    const { engineId } = await p640Engine(db, world, "fl");
    const text = readFileSync("fixtures/imports/clean.csv", "utf8").replaceAll("MG-0417", `MK-${Date.now().toString(36)}`);
    const i = await previewHistory(engineer, world.vessel1, engineId, text);
    const before = await snapshotTables(db, await others());
    const importParams = { params: Promise.resolve({ importId: String(i.id) }) } as never;
    // The commit writes the records, their readings and rings, then the audit trail: it waits there.
    const held = await hold("LOCK TABLES audit_log WRITE");
    try {
      asCaller(engineerCookie);
      const committing = commitImportRoute(request("POST", `/api/imports/${i.id}/commit`, { confirmWarnings: true }), importParams);
      await halfWay();
      await killMariadb();
      await expectUnavailable(await committing, /database/i);
    } finally {
      held.destroy();
      if (!(await portOpen(DB_PORT))) await startMariadb();
    }
    expect(changedTables(before, await snapshotTables(db, await others())), "half-written import after the crash").toEqual([]);
    expect(await db("inspections").where({ import_id: i.id }).count({ n: "*" }).first()).toMatchObject({ n: 0 });

    const again = await commitImportRoute(request("POST", `/api/imports/${i.id}/commit`, { confirmWarnings: true }), importParams);
    expect(again.status, await again.clone().text()).toBe(200);
    expect(Number((await db("inspections").where({ import_id: i.id }).count({ n: "*" }).first())!.n)).toBeGreaterThan(0);
  }, 120_000);
});

describe("the S3 and SMTP fakes stopped", () => {
  it("a photo completed while the store is down is refused with 503 and leaves no ledger row; it completes when the store is back", async () => {
    const engineer = person(world.users.engineer);
    const d = await draftOn(units[2], engineer, { complete: false });
    const slot = await uploadToSlot(d.id, engineer, await makeImage("png"));
    const body = { fileId: slot.fileId, caption: "Liner s2", stationKey: null, ringPosition: null };
    await stopFakes();
    try {
      const before = await snapshotTables(db, await others());
      asCaller(engineerCookie);
      await expectUnavailable(await completeRoute(request("POST", `/api/inspections/${d.id}/photos/complete`, body), params(d.id)), /store/i);
      expect(changedTables(before, await snapshotTables(db, await others()))).toEqual([]);

      // Mail due meanwhile waits in the outbox with the error kept.
      await queueMail({ to: "chief@faults.test", subject: "Fault test mail", text: "Sent after the mail server came back.", html: "", kind: "fault_test" });
      await outboxIdle();
      expect(await drainOutbox()).toBe(0);
      const waiting = await db("mail_outbox").where({ subject: "Fault test mail" }).first("status", "attempts", "last_error");
      expect(waiting).toMatchObject({ status: "pending", attempts: 1 });
      expect(waiting.last_error).toBeTruthy();
    } finally {
      await startFakes();
    }
    const res = await completeRoute(request("POST", `/api/inspections/${d.id}/photos/complete`, body), params(d.id));
    expect(res.status, await res.clone().text()).toBe(201);
    // The outbox sends it on its next attempt.
    const later = new Date(Date.now() + 3_600_000);
    expect(await drainOutbox({ now: () => later })).toBeGreaterThanOrEqual(1);
    expect((await db("mail_outbox").where({ subject: "Fault test mail" }).first("status")).status).toBe("sent");
    const mailDir = process.env.MAIL_FAKE_DIR!;
    expect(fs.readdirSync(mailDir).some((f) => fs.readFileSync(path.join(mailDir, f), "utf8").includes("Fault test mail"))).toBe(true);

    // No ledger row points at a missing object.
    const stored = await db("stored_files").where({ status: "stored" }).select("object_key");
    const missing: string[] = [];
    for (const f of stored) if ((await objectSize(f.object_key)) === null) missing.push(f.object_key);
    expect(missing).toEqual([]);
  }, 120_000);
});
