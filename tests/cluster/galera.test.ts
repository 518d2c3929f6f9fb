import { randomBytes } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import knex, { type Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { loadInspectionContext } from "@/lib/inspections/context-queries";
import { completeDraft, daysAgo, ensureHoursLog, ensureLiner, makeImage } from "../support/inspection-builders";

/*
 * Kalibore on a three-node MariaDB Galera cluster with two app instances (started by
 * scripts/test-cluster.sh): A on node 1, B through haproxy on node 2 (node 3 as its backup).
 * Everything goes through the instances' HTTP API, as browsers would; the database is read
 * on each surviving node directly to check what is stored there.
 */
const env = process.env;
const [port1, port2, port3] = (env.CLUSTER_NODE_PORTS ?? "").split(" ").map(Number);
const A = `http://127.0.0.1:${env.CLUSTER_APP_A_PORT}`;
const B = `http://127.0.0.1:${env.CLUSTER_APP_B_PORT}`;
const ORIGIN = env.APP_URL!;
const node = (port: number) =>
  knex({
    client: "mysql2",
    connection: { host: "127.0.0.1", port, user: env.DB_MIGRATION_USER, password: env.DB_MIGRATION_PASSWORD, database: env.DB_NAME, dateStrings: ["DATE"] as unknown as boolean },
    pool: { min: 0, max: 2 },
  });
const token = () => randomBytes(18).toString("base64url");

let n1: Knex;
let n3: Knex;
let world: RoleWorld;
let units: { id: number; vesselId: number }[] = [];
const cookies: Record<string, string> = {};

async function signIn(base: string, email: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in/email`, { method: "POST", headers: { "content-type": "application/json", origin: ORIGIN }, body: JSON.stringify({ email, password: WORLD_PASSWORD }) });
  if (!res.ok) throw new Error(`sign-in ${email} at ${base}: ${res.status} ${await res.text()}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
}

const api = (base: string, cookie: string, method: string, p: string, body?: unknown) =>
  fetch(`${base}${p}`, {
    method,
    headers: { cookie, origin: ORIGIN, ...(body === undefined ? {} : { "content-type": "application/json" }) },
    body: body === undefined ? undefined : JSON.stringify(body),
    redirect: "manual",
  });

const createBody = (unitId: number, clientToken = token()) => ({
  unitId,
  clientToken,
  inspectedOn: daysAgo(0),
  engineHours: 40_000,
  linerHours: 30_000,
  linerHoursReason: null,
  crew: "3/E",
  gaugeTempC: 24,
  linerTempC: 31,
});
const cookieFor = (vesselId: number) => (vesselId === world.vessel1 ? cookies.engineer : cookies.engineer2);

beforeAll(async () => {
  n1 = node(port1);
  n3 = node(port3);
  // A small fleet of its own: the role world, plus four more engines, every unit with a liner and an hours log.
  world = await buildRoleWorld(n1, "cluster");
  for (let k = 3; k <= 6; k++) {
    const vessel = k % 2 ? world.vessel1 : world.vessel2;
    const [engine] = await n1("main_engines").insert({ serial: `T-cluster-${k}`, vessel_id: vessel, profile_id: world.profileId, cylinder_count: 6 });
    await n1("cylinder_units").insert([1, 2, 3, 4, 5, 6].map((c) => ({ engine_id: engine, cylinder_no: c })));
  }
  const rows = await n1("cylinder_units as u").join("main_engines as e", "e.id", "u.engine_id").whereIn("e.vessel_id", [world.vessel1, world.vessel2]).orderBy("u.id").select("u.id", "u.engine_id", "e.vessel_id");
  for (const r of rows) await ensureLiner(n1, r.id, { installedEngineHours: 10_000, linerHoursAtInstall: 0 });
  for (const e of new Set(rows.map((r) => r.engine_id as number))) await ensureHoursLog(n1, e);
  units = rows.map((r) => ({ id: r.id, vesselId: r.vessel_id }));
  // Signed in through A only: B must know these sessions from the database alone.
  cookies.engineer = await signIn(A, world.users.engineer.email);
  cookies.engineer2 = await signIn(A, world.users.engineer2.email);
}, 120_000);

afterAll(async () => {
  await n1?.destroy();
  await n3?.destroy();
});

describe("two app instances on a Galera cluster", () => {
  it("a record saved through instance A is read through instance B at once (same session, other node)", async () => {
    const unit = units[0];
    const created = await api(A, cookieFor(unit.vesselId), "POST", "/api/inspections", createBody(unit.id));
    expect(created.status, await created.clone().text()).toBe(201);
    const { id } = (await created.json()) as { id: number };
    const read = await api(B, cookieFor(unit.vesselId), "GET", `/api/inspections/${id}`);
    expect(read.status).toBe(200);
    expect(await read.json()).toMatchObject({ id, unitId: unit.id, state: "draft" });
  });

  it("a photo uploaded through A's signed URL is completed through B and served through A", async () => {
    const unit = units[0];
    const cookie = cookieFor(unit.vesselId);
    const { id } = (await n1("inspections").where({ unit_id: unit.id, state: "draft" }).first("id"))!;
    const bytes = await makeImage("png", 24);
    const slot = await api(A, cookie, "POST", `/api/inspections/${id}/photos`, { fileName: "liner.png", contentType: "image/png", sizeBytes: bytes.length });
    expect(slot.status, await slot.clone().text()).toBe(201);
    const s = (await slot.json()) as { uploadUrl: string; headers: Record<string, string>; fileId: number };
    expect((await fetch(s.uploadUrl, { method: "PUT", headers: s.headers, body: new Blob([bytes as Uint8Array<ArrayBuffer>]) })).status).toBe(200);
    const done = await api(B, cookie, "POST", `/api/inspections/${id}/photos/complete`, { fileId: s.fileId, caption: null, stationKey: null, ringPosition: null });
    expect(done.status, await done.clone().text()).toBe(201);
    const photo = (await done.json()) as { id: number };
    const view = await api(A, cookie, "GET", `/api/inspections/${id}/photos/${photo.id}?variant=full`);
    expect(view.status).toBe(302);
    expect(Buffer.from(await (await fetch(view.headers.get("location")!)).arrayBuffer()).equals(bytes)).toBe(true);
  });

  it("a node killed in the middle of a stream of saves: every save lands once on the surviving nodes", async () => {
    const stream = units.slice(1, 31).map((u, i) => ({ unit: u, via: i % 2 ? B : A, body: createBody(u.id), attempts: 0, id: 0 as number, status: 0 }));
    const killAfter = 8;
    let done = 0;
    let killed = false;
    const killNode2 = () => {
      const pid = Number(fs.readFileSync(path.join(env.CLUSTER_DIR!, "node2", "run", "node.pid"), "utf8"));
      process.kill(pid, "SIGKILL");
      killed = true;
    };
    // The device's rule: a save that fails or gets no answer is sent again, with the same token.
    const save = async (s: (typeof stream)[number]) => {
      for (;;) {
        s.attempts++;
        try {
          const res = await api(s.via, cookieFor(s.unit.vesselId), "POST", "/api/inspections", s.body);
          s.status = res.status;
          if (res.status === 201 || res.status === 200) {
            s.id = ((await res.json()) as { id: number }).id;
            break;
          }
          if (res.status < 500) throw new Error(`save refused for good: ${res.status} ${await res.text()}`);
        } catch (err) {
          if (err instanceof Error && err.message.startsWith("save refused")) throw err;
        }
        if (s.attempts >= 40) throw new Error(`save of unit ${s.unit.id} not done after ${s.attempts} attempts (last ${s.status})`);
        await new Promise((r) => setTimeout(r, 500));
      }
      if (++done === killAfter) killNode2();
    };
    const queue = [...stream];
    await Promise.all(Array.from({ length: 4 }, async () => { for (let s = queue.shift(); s; s = queue.shift()) await save(s); }));
    expect(killed).toBe(true);

    const [size] = (await n1.raw("SHOW STATUS LIKE 'wsrep_cluster_size'"))[0] as { Value: string }[];
    expect(Number(size.Value)).toBe(2);
    const tokens = stream.map((s) => s.body.clientToken);
    for (const survivor of [n1, n3]) {
      const rows = (await survivor("inspections").whereIn("client_token", tokens).select("id", "client_token", "unit_id")) as { id: number; client_token: string; unit_id: number }[];
      expect(rows.length).toBe(stream.length); // none lost, none twice
      const byToken = new Map(rows.map((r) => [r.client_token, r]));
      for (const s of stream) expect(byToken.get(s.body.clientToken)).toMatchObject({ id: s.id, unit_id: s.unit.id });
      const perUnit = await survivor("inspections").whereIn("unit_id", stream.map((s) => s.unit.id)).whereIn("state", ["draft", "returned"]).groupBy("unit_id").select("unit_id").count({ n: "*" });
      expect(perUnit.every((r) => Number(r.n) === 1)).toBe(true);
    }
    console.log(`cluster: ${stream.length} saves, ${stream.filter((s) => s.attempts > 1).length} sent more than once (${stream.reduce((a, s) => a + s.attempts, 0)} requests); node 2 killed after ${killAfter}`);
  }, 240_000);

  it("the mail outbox, swept by both instances at once, sends each mail once", async () => {
    const run = token().slice(0, 8);
    const mails = Array.from({ length: 20 }, (_, k) => ({ to_address: `once-${k}@cluster.test`, subject: `cluster-once-${run}-${k}`, text_body: "once", kind: "test", next_attempt_at: new Date() }));
    await n1("mail_outbox").insert(mails);
    // Wakes both instances' senders together: each queues a reset mail and drains the outbox.
    const wake = (base: string, email: string) => fetch(`${base}/api/auth/request-password-reset`, { method: "POST", headers: { "content-type": "application/json", origin: ORIGIN }, body: JSON.stringify({ email, redirectTo: "/reset-password" }) });
    await Promise.all([wake(A, world.users.chief.email), wake(B, world.users.chief2.email)]);
    const subjects = mails.map((m) => m.subject);
    for (let i = 0; i < 120; i++) {
      const left = await n3("mail_outbox").whereIn("subject", subjects).whereNot("status", "sent").count({ n: "*" });
      if (Number(left[0].n) === 0) break;
      await new Promise((r) => setTimeout(r, 500));
    }
    const sent = fs.readdirSync(env.MAIL_FAKE_DIR!).map((f) => fs.readFileSync(path.join(env.MAIL_FAKE_DIR!, f), "utf8"));
    for (const subject of subjects) expect(sent.filter((m) => new RegExp(`^Subject: ${subject}\\r?$`, "m").test(m)).length, subject).toBe(1);
  }, 90_000);

  it("the weekly digest, run by a scheduler on both instances at once, queues and sends each person's digest once", async () => {
    // Something to say: the first draft, completed and submitted through B, waits for the chief's approval.
    const unit = units[0];
    const cookie = cookieFor(unit.vesselId);
    const draft = (await n1("inspections").where({ unit_id: unit.id, state: "draft" }).first("id", "revision"))!;
    const ctx = (await loadInspectionContext(n1, unit.id, { inspectedOn: daysAgo(0) }))!;
    const saved = await api(B, cookie, "PUT", `/api/inspections/${draft.id}`, { revision: draft.revision, draft: completeDraft(ctx, { inspectedOn: daysAgo(0), engineHours: 40_000, wearMm: 0.4 }) });
    expect(saved.status, await saved.clone().text()).toBe(200);
    const submitted = await api(B, cookie, "POST", `/api/inspections/${draft.id}/submit`, {});
    expect(submitted.status, await submitted.clone().text()).toBe(200);

    const runDigest = async (base: string) => {
      for (let attempt = 1; ; attempt++) {
        const res = await fetch(`${base}/api/jobs/digest`, { method: "POST", headers: { authorization: `Bearer ${env.JOBS_TOKEN}` } });
        // A run refused part-way (a node's certification conflict) is simply run again: nothing is queued twice.
        if (res.status === 200 || attempt >= 5) return { status: res.status, body: (await res.json()) as { queued: number; alreadyQueued: number; people: number } };
      }
    };
    const [a, b] = await Promise.all([runDigest(A), runDigest(B)]);
    expect([a.status, b.status]).toEqual([200, 200]);
    const rows = (await n1("mail_outbox").where({ kind: "weekly_digest" }).select("id", "to_address", "subject", "dedupe_key")) as { to_address: string; subject: string; dedupe_key: string }[];
    expect(rows.length).toBeGreaterThan(0);
    expect(a.body.queued + b.body.queued).toBe(rows.length);
    expect(new Set(rows.map((r) => r.dedupe_key)).size).toBe(rows.length);
    for (let i = 0; i < 120; i++) {
      const left = await n3("mail_outbox").where({ kind: "weekly_digest" }).whereNot("status", "sent").count({ n: "*" });
      if (Number(left[0].n) === 0) break;
      await new Promise((r) => setTimeout(r, 500));
    }
    const sent = fs.readdirSync(env.MAIL_FAKE_DIR!).map((f) => fs.readFileSync(path.join(env.MAIL_FAKE_DIR!, f), "utf8"));
    for (const r of rows) expect(sent.filter((m) => new RegExp(`^To: ${r.to_address}\\r?$`, "m").test(m) && m.includes(r.subject.slice(0, 30))).length, r.to_address).toBe(1);
    console.log(`cluster: weekly digest run on both instances at once — ${a.body.people} people, ${rows.length} digests queued (A ${a.body.queued}, B ${b.body.queued}), each sent once`);
  }, 90_000);

  it("keeps the per-address sign-in counts in the database, shared by both instances", async () => {
    const rows = await n3("rateLimit").count({ n: "*" });
    expect(Number(rows[0].n)).toBeGreaterThan(0);
  });
});
