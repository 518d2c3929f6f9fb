import { execFile } from "node:child_process";
import { existsSync, readdirSync, readFileSync } from "node:fs";
import { promisify } from "node:util";
import path from "node:path";
import { simpleParser, type ParsedMail } from "mailparser";
import nodemailer, { type SendMailOptions } from "nodemailer";
import { SMTPServer } from "smtp-server";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));
// The job route's work, watched: a refused call must not start it.
vi.mock("@/lib/notifications/digest-mutations", async (original) => {
  const real = await original<typeof import("@/lib/notifications/digest-mutations")>();
  return { ...real, runWeeklyDigest: vi.fn(real.runWeeklyDigest) };
});

import { POST as digestRoute } from "@/app/api/jobs/digest/route";
import type { CurrentUser } from "@/lib/auth/session";
import { db } from "@/lib/db/knex";
import { serverEnv } from "@/lib/env";
import { randomToken } from "@/lib/inspections/form";
import { approveInspection, createInspection, returnInspection, saveDraft, submitInspection } from "@/lib/inspections/mutations";
import { issueInvitation } from "@/lib/invitations/mutations";
import { hashInvitationToken } from "@/lib/invitations/token";
import { drainOutbox, MAX_ATTEMPTS, outboxIdle, queueMail } from "@/lib/mail/outbox";
import { mailer } from "@/lib/mail/transport";
import { savePreferencesAction } from "@/lib/notifications/actions";
import { alertUnitsInsideHorizon } from "@/lib/notifications/alert-mutations";
import { alertFromOutlook } from "@/lib/notifications/outlook-alerts";
import { runWeeklyDigest } from "@/lib/notifications/digest-mutations";
import { savePreferences } from "@/lib/notifications/mutations";
import { listFailedAddresses, listNotifications } from "@/lib/notifications/queries";
import { isoWeek } from "@/lib/notifications/topics";
import { completeDraft, readyUnit } from "../support/inspection-builders";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld, type WorldUser } from "../support/role-world";
import { signInCookie } from "../support/sessions";

/*
 * Alerts and the digest, end to end through the real mutations, MariaDB, the outbox sender and
 * an SMTP server: who gets what, once, with a working link; nothing lost while the mail server
 * is down; a bounce is shown and not retried; the digest goes once per person per week.
 */

const MAIL_DIR = process.env.MAIL_FAKE_DIR ?? path.resolve(".test-data/mail");
const APP = serverEnv.APP_URL.replace(/\/$/, "");
let world: RoleWorld;
let units: number[] = [];
type U = WorldUser;

beforeAll(async () => {
  world = await buildRoleWorld(db, "notify");
  // Units of their own for this file's records (each test takes fresh ones).
  const have = (await db("cylinder_units").where({ engine_id: world.engine1 }).max({ m: "cylinder_no" }).first())?.m ?? 0;
  await db("cylinder_units").insert(Array.from({ length: 16 }, (_, i) => ({ engine_id: world.engine1, cylinder_no: have + i + 1 })));
  units = await db("cylinder_units").where({ engine_id: world.engine1 }).where("cylinder_no", ">", have).orderBy("cylinder_no").pluck("id");
  // Everyone starts subscribed to everything (a previous run may have left choices behind).
  await db("notification_preferences").whereIn("user_id", Object.values(world.users).map((u) => u.id)).delete();
}, 120_000);

afterAll(async () => {
  await outboxIdle();
});

const actor = (u: U) => ({ id: u.id, name: u.name });

/** Rows queued for one cause (dedupe keys start with "<topic>:<subject>:"). */
async function queuedFor(prefix: string) {
  return db("mail_outbox").where("dedupe_key", "like", `${prefix}%`).orderBy("to_address").select("to_address", "user_id", "vessel_id", "kind", "link_path", "status", "subject");
}

/** Every captured mail to `address` whose subject contains `subject`, waiting for the sender. */
async function mailsTo(address: string, subject: string, want = 1, timeoutMs = 15_000): Promise<ParsedMail[]> {
  const until = Date.now() + timeoutMs;
  let found: ParsedMail[] = [];
  while (Date.now() < until) {
    found = [];
    if (existsSync(MAIL_DIR)) {
      for (const f of readdirSync(MAIL_DIR)) {
        const raw = readFileSync(path.join(MAIL_DIR, f), "utf8");
        if (!raw.includes(address)) continue;
        const mail = await simpleParser(raw);
        const to = (Array.isArray(mail.to) ? mail.to : [mail.to]).flatMap((t) => t?.value ?? []).map((v) => v.address);
        if (to.includes(address) && (mail.subject ?? "").includes(subject)) found.push(mail);
      }
    }
    if (found.length >= want) return found;
    await new Promise((r) => setTimeout(r, 150));
  }
  return found;
}

/** A complete draft on a fresh unit of vessel 1, entered by `by`; `wearMm` at the worst station. */
async function draft(by: U, wearMm = 0.4) {
  const unitId = units.shift()!;
  const ctx = await readyUnit(unitId);
  const d = completeDraft(ctx, { inspectedOn: new Date().toISOString().slice(0, 10), engineHours: 39_000, wearMm });
  // A reading at or over the limit is a warning the engineer confirms (lib/wear/plausibility.ts).
  d.readings = d.readings.map((r) => (r.diameterMm - ctx.profile.boreMm >= ctx.profile.linerWearLimitMm * 0.8 ? { ...r, warningConfirmed: "Checked twice: the liner is worn this far." } : r));
  const { id } = await createInspection(actor(by), { unitId, clientToken: randomToken(24), ...d.header });
  const saved = await saveDraft(actor(by), id, 1, d);
  return { id, unitId, revision: saved.revision };
}

describe("alerts", () => {
  it("a submitted record goes to the vessel's chief engineer only, once, with a link to the record", async () => {
    const { engineer, chief } = world.users;
    const d = await draft(engineer);
    await submitInspection(actor(engineer), d.id, d.revision);
    await submitInspection(actor(engineer), d.id, undefined); // a repeated submit answers "already done"
    const rows = await queuedFor(`inspection_submitted:inspection:${d.id}:`);
    expect(rows.map((r) => r.to_address)).toEqual([chief.email]);
    expect(rows[0]).toMatchObject({ user_id: chief.id, vessel_id: world.vessel1, link_path: `/inspections/${d.id}` });
    const [mail] = await mailsTo(chief.email, "Record to approve");
    expect(mail.subject).toBe("Record to approve: Test Petrel, cylinder " + (await db("cylinder_units").where({ id: d.unitId }).first("cylinder_no")).cylinder_no);
    expect(mail.text).toContain(`${APP}/inspections/${d.id}`);
    expect(mail.text).toContain("Eli Engineer submitted");
    expect(mail.text).toMatch(/at 39,000 engine hours, 29,000 liner hours/);
  });

  it("a record the chief entered and submitted himself goes to the superintendent (second-approver rule)", async () => {
    const { chief, supt } = world.users;
    const d = await draft(chief);
    await submitInspection(actor(chief), d.id, d.revision);
    const rows = await queuedFor(`inspection_submitted:inspection:${d.id}:`);
    expect(rows.map((r) => r.to_address)).toEqual([supt.email]);
  });

  it("a returned record goes to its author with the comment", async () => {
    const { engineer, chief } = world.users;
    const d = await draft(engineer);
    await submitInspection(actor(engineer), d.id, d.revision);
    await returnInspection(actor(chief), d.id, "Station 2 fore–aft looks transposed; gauge it again.");
    const rows = await queuedFor(`inspection_returned:inspection:${d.id}:`);
    expect(rows.map((r) => r.to_address)).toEqual([engineer.email]);
    const [mail] = await mailsTo(engineer.email, "Record returned");
    expect(mail.text).toContain("Station 2 fore–aft looks transposed");
    expect(mail.text).toContain(`${APP}/inspections/${d.id}`);
  });

  it("an approval over the limit goes to the superintendent (and not to the chief who approved it), linking the unit", async () => {
    const { engineer, chief, supt } = world.users;
    const d = await draft(engineer, 3.7); // limit 3.6 mm in the role world's profile
    await submitInspection(actor(engineer), d.id, d.revision);
    await approveInspection(actor(chief), d.id);
    await approveInspection(actor(chief), d.id); // repeated: already done, nothing new
    const rows = await queuedFor(`unit_over_limit:inspection:${d.id}:`);
    expect(rows.map((r) => r.to_address)).toEqual([supt.email]);
    const [mail] = await mailsTo(supt.email, "Over limit");
    expect(mail.text).toContain(`${APP}/units/${d.unitId}`);
    expect(mail.text).toMatch(/Largest wear 3\.\d+ mm \(limit 3\.60 mm\)/);
    expect(mail.text).toContain("Chris Chief approved");
  });

  it("a unit whose limit date comes inside the company's horizon alerts its chief and superintendent once", async () => {
    const { chief, supt, chief2 } = world.users;
    const unitId = units.shift()!;
    const linerId = await db("liners").insert({ unit_id: unitId, serial: `HZ-${Date.now().toString(36)}`, installed_on: "2024-01-10", installed_engine_hours: 10_000 }).then(([id]) => id);
    const inDays = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);
    const row = { unit_id: unitId, liner_id: linerId, band: "renew_before_next", max_wear_mm: 2.9, limit_on: inDays(200), limit_on_earliest: inDays(400), limit_on_latest: inDays(500), summary: JSON.stringify({ rings: [] }), last_inspected_on: inDays(-5) };
    await db("unit_analysis").insert(row).onConflict("unit_id").merge();
    // Early bound 400 days away: outside the default 183-day horizon, no alert.
    expect(await alertUnitsInsideHorizon(db, { unitIds: [unitId] })).toBe(0);
    await db("unit_analysis").where({ unit_id: unitId }).update({ limit_on_earliest: inDays(150) });
    expect(await alertUnitsInsideHorizon(db, { unitIds: [unitId] })).toBe(2);
    expect(await alertUnitsInsideHorizon(db, { unitIds: [unitId] })).toBe(0);
    const rows = await queuedFor(`unit_horizon:liner:${linerId}:`);
    expect(rows.map((r) => r.to_address).sort()).toEqual([chief.email, supt.email].sort());
    expect(rows.map((r) => r.to_address)).not.toContain(chief2.email);
    const [mail] = await mailsTo(chief.email, "Limit in sight");
    expect(mail.text).toContain(`${APP}/units/${unitId}`);
    expect(mail.text).toContain("alert horizon of 183 days");
  });

  it("someone who switched every alert off gets none; the others still do", async () => {
    const { engineer, chief, supt } = world.users;
    asCaller(await signInCookie(supt.email, WORLD_PASSWORD));
    const saved = await savePreferencesAction(undefined, {});
    expect(saved.ok).toBe(true);
    const d = await draft(engineer, 3.75);
    await submitInspection(actor(engineer), d.id, d.revision);
    await approveInspection(actor(chief), d.id);
    expect(await queuedFor(`unit_over_limit:inspection:${d.id}:`)).toEqual([]);
    // The chief submits one himself: the superintendent would approve it, but hears nothing.
    const own = await draft(chief);
    await submitInspection(actor(chief), own.id, own.revision);
    expect(await queuedFor(`inspection_submitted:inspection:${own.id}:`)).toEqual([]);
    await savePreferences(supt, ["inspection_submitted", "unit_over_limit", "unit_horizon", "unit_probability", "plan_missed", "spare_order_by", "weekly_digest"]);
  });
});

describe("alerts from the renewal outlook", () => {
  const inDays = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);
  const scope = () => ({ vessels: [world.vessel1, world.vessel2] });

  it("a likely overrun by the next overhaul, a missed renewal and a spare to order each alert once, to the right people", async () => {
    const { engineer, chief, supt, chief2 } = world.users;
    // Unit A: an approved record, then a wear trend steep enough to pass the 3.6 mm limit long
    // before the next overhaul (16,000 h on): invented figures, the outlook's own arithmetic.
    const a = await draft(engineer);
    await submitInspection(actor(engineer), a.id, a.revision);
    await approveInspection(actor(chief), a.id);
    const fit = { model: "intercept", n: 6, df: 4, intercept: 0, slope: 0.0002, mse: 0.0004, xMean: 20_000, sxx: 1e9, sumX2: 3.4e9 };
    await db.raw("UPDATE unit_analysis SET detail = JSON_SET(COALESCE(detail, '{}'), '$.fit', JSON_EXTRACT(?, '$')) WHERE unit_id = ?", [JSON.stringify(fit), a.unitId]);
    // Unit B: a liner renewal pencilled in for yesterday, not done. Unit C: one in three weeks,
    // and no spare liner anywhere with a 30-day lead time, so the order is already late.
    const [b, c] = [units.shift()!, units.shift()!];
    const [planB] = await db("renewal_plans").insert({ unit_id: b, part: "liner", planned_on: inDays(-1), port_or_yard: "Port Blanc", status: "pencilled", created_by: supt.id });
    await db("renewal_plans").insert({ unit_id: c, part: "liner", planned_on: inDays(21), status: "confirmed", created_by: supt.id });
    await db("spares_stock").insert({ company_id: world.companyId, profile_id: world.profileId, part: "liner", vessel_id: null, on_hand: 0, on_order: 0, lead_time_days: 30 });

    const first = await alertFromOutlook(db, new Date(), scope());
    expect(first).toBeGreaterThanOrEqual(4);
    expect(await alertFromOutlook(db, new Date(), scope())).toBe(0);

    const chance = await queuedFor(`unit_probability:unit:${a.unitId}:`);
    expect(chance.map((r) => r.to_address).sort()).toEqual([chief.email, supt.email].sort());
    const missed = await queuedFor(`plan_missed:plan:${planB}:`);
    expect(missed.map((r) => r.to_address)).toEqual([supt.email]);
    const spare = await queuedFor(`spare_order_by:spare:${world.profileId}:liner:`);
    expect(spare.map((r) => r.to_address)).toEqual([supt.email]);
    expect(spare[0].link_path).toBe("/outlook/spares");
    for (const rows of [chance, missed, spare]) expect(rows.map((r) => r.to_address)).not.toContain(chief2.email);

    const [mail] = await mailsTo(chief.email, "Likely over limit by next overhaul");
    expect(mail.text).toMatch(/has a (9\d|100) % chance of passing its limit by the next overhaul/);
    expect(mail.text).toContain("The company's threshold is 20 %.");
    expect(mail.text).toContain(`${APP}/units/${a.unitId}`);
    const [planMail] = await mailsTo(supt.email, "Renewal not done");
    expect(planMail.text).toContain(`planned for ${new Date(Date.now() - 86_400_000).getUTCDate()}`);
    expect(planMail.text).toContain("at Port Blanc");
    const [spareMail] = await mailsTo(supt.email, "Order ");
    expect(spareMail.text).toContain("that day has already passed");
    expect(spareMail.text).toContain(`${APP}/outlook/spares`);
  });
});

describe("the outbox", () => {
  it("keeps an alert caused while the mail server is down and delivers it once the server is back", async () => {
    const { engineer, chief } = world.users;
    // A mail server of this test's own, which it can stop and start.
    const received: string[] = [];
    const make = () =>
      new SMTPServer({ authOptional: true, disabledCommands: ["STARTTLS"], logger: false, onData(stream, _s, cb) { let t = ""; stream.on("data", (c) => (t += c)); stream.on("end", () => { received.push(t); cb(); }); } });
    let server = make();
    await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
    const port = (server.server.address() as { port: number }).port;
    await new Promise<void>((r) => server.close(r)); // down
    const transport = nodemailer.createTransport({ host: "127.0.0.1", port, secure: false, ignoreTLS: true, connectionTimeout: 2000 });
    const send = vi.spyOn(mailer, "sendMail").mockImplementation(((m: SendMailOptions) => transport.sendMail(m)) as never);
    try {
      const d = await draft(engineer);
      await submitInspection(actor(engineer), d.id, d.revision); // the answer does not wait for the mail server
      const key = `inspection_submitted:inspection:${d.id}:`;
      await vi.waitFor(async () => expect((await queuedFor(key))[0]).toMatchObject({ status: "pending" }), { timeout: 10_000 });
      await vi.waitFor(async () => expect((await db("mail_outbox").where("dedupe_key", "like", `${key}%`).first("attempts")).attempts).toBeGreaterThanOrEqual(1), { timeout: 10_000 });
      await outboxIdle();
      const failed = await db("mail_outbox").where("dedupe_key", "like", `${key}%`).first("status", "last_error", "next_attempt_at");
      expect(failed.status).toBe("pending");
      expect(failed.last_error).toMatch(/ECONNREFUSED|connect/i);

      server = make();
      await new Promise<void>((r) => server.listen(port, "127.0.0.1", r)); // up again
      await drainOutbox({ now: () => new Date(Date.now() + 3_600_000) }); // as if the retry were due
      const sent = await db("mail_outbox").where("dedupe_key", "like", `${key}%`).first("status", "to_address");
      expect(sent).toMatchObject({ status: "sent", to_address: chief.email });
      expect(received.filter((m) => m.includes(`/inspections/${d.id}`))).toHaveLength(1);
    } finally {
      send.mockRestore();
      await outboxIdle();
      await new Promise<void>((r) => server.close(r));
    }
  });

  it("marks a bounce failed at once, never retries it, and shows it to the administrator only", async () => {
    const bouncer = `nobody-${Date.now().toString(36)}@ship.invalid`; // the SMTP fake refuses .invalid with 550
    await queueMail({ to: bouncer, kind: "unit_horizon", vesselId: world.vessel1, subject: "Limit in sight: test", text: "t", html: "<p>t</p>", dedupeKey: `test-bounce:${bouncer}` });
    await outboxIdle();
    await drainOutbox();
    const row = await db("mail_outbox").where({ to_address: bouncer }).first("status", "failure", "attempts", "last_error");
    expect(row).toMatchObject({ status: "failed", failure: "bounced", attempts: 1 });
    expect(row.last_error).toMatch(/550|mailbox unavailable/);
    await drainOutbox({ now: () => new Date(Date.now() + 7 * 86_400_000) });
    expect((await db("mail_outbox").where({ to_address: bouncer }).first("attempts")).attempts).toBe(1);

    const admin: CurrentUser = { ...world.users.admin, vessels: "all" };
    expect((await listFailedAddresses()).find((a) => a.address === bouncer)).toMatchObject({ bounced: true, failed: 1 });
    const seen = await listNotifications(admin, { state: "failed" });
    expect(seen.find((n) => n.to === bouncer)).toMatchObject({ state: "failed", failure: "bounced" });
    const other: CurrentUser = { ...world.users.chief2, vessels: [world.vessel2] };
    expect((await listNotifications(other, {})).find((n) => n.to === bouncer)).toBeUndefined();
    const crew: CurrentUser = { ...world.users.engineer, vessels: [world.vessel1] };
    const crewView = (await listNotifications(crew, {})).find((n) => n.to === bouncer);
    expect(crewView).toMatchObject({ state: "failed", lastError: null }); // about their vessel, without the server's answer
  });

  it("gives up after the last attempt of a mail that keeps failing, and says so", async () => {
    const to = `flaky-${Date.now().toString(36)}@mail.test`;
    const temporary = Object.assign(new Error("451 4.3.0 try again later"), { responseCode: 451 });
    const send = vi.spyOn(mailer, "sendMail").mockRejectedValue(temporary as never);
    try {
      await queueMail({ to, kind: "test", subject: "Flaky", text: "t", html: "<p>t</p>", dedupeKey: `test-flaky:${to}` });
      await outboxIdle();
      let t = Date.now();
      for (let i = 0; i < MAX_ATTEMPTS + 2; i++) {
        t += 2 * 3_600_000;
        await drainOutbox({ now: () => new Date(t) });
      }
    } finally {
      send.mockRestore();
    }
    expect(await db("mail_outbox").where({ to_address: to }).first("status", "failure", "attempts")).toMatchObject({ status: "failed", failure: "gave_up", attempts: MAX_ATTEMPTS });
  });

  it("queues the invitation e-mail with the invitation, and its link is the invitation's", async () => {
    const email = `invitee-${Date.now().toString(36)}@notify.test`;
    const issued = await issueInvitation(actor(world.users.admin), { name: "Ivo Invitee", email, role: "engineer", vesselIds: [world.vessel1] });
    if (issued.kind !== "issued") throw new Error(issued.kind);
    expect(await db("mail_outbox").where({ to_address: email, kind: "invitation" }).count({ n: "*" }).first()).toMatchObject({ n: 1 });
    const [mail] = await mailsTo(email, "Kalibore");
    const token = /\/invite\/([A-Za-z0-9_-]+)/.exec(mail.text ?? "")?.[1];
    expect(hashInvitationToken(token!)).toBe((await db("invitations").where({ id: issued.invitationId }).first("token_hash")).token_hash);
  });
});

describe("the weekly digest", () => {
  const token = process.env.JOBS_TOKEN;
  const call = (authorization?: string) =>
    digestRoute(new Request(`${APP}/api/jobs/digest`, { method: "POST", headers: authorization === undefined ? {} : { authorization } }));

  it("refuses a missing, malformed or wrong job token with 401 and runs nothing", async () => {
    const run = vi.mocked(runWeeklyDigest);
    run.mockClear();
    for (const auth of [undefined, "", "Bearer", `Basic ${token}`, `Bearer ${token}x`, `bearer ${token}`, `Bearer ${"a".repeat(600)}`, `Bearer ${token?.slice(0, -1)}`]) {
      const res = await call(auth);
      expect(res.status, String(auth)).toBe(401);
    }
    expect(run).not.toHaveBeenCalled();
  });

  it("two runs at once send one digest to each person; a third run in the week sends nothing new", async () => {
    expect(token, "scripts/test.sh sets JOBS_TOKEN").toBeTruthy();
    const { engineer, chief, supt, chief2, admin } = world.users;
    await savePreferences(chief2, []); // unsubscribed: no digest
    // Something to report: a record waiting on vessel 1.
    const d = await draft(engineer);
    await submitInspection(actor(engineer), d.id, d.revision);
    const week = isoWeek(new Date());
    const [a, b] = await Promise.all([call(`Bearer ${token}`), runWeeklyDigest()]);
    expect(a.status).toBe(200);
    const runA = await a.json();
    expect(runA.week).toBe(week);
    const keys = [engineer, chief, supt].map((u) => `weekly_digest:${week}:${u.id}`);
    const rows = await db("mail_outbox").whereIn("dedupe_key", keys).select("to_address");
    expect(rows.map((r) => r.to_address).sort()).toEqual([engineer.email, chief.email, supt.email].sort());
    expect(runA.queued + b.queued).toBeGreaterThanOrEqual(3);
    expect(await db("mail_outbox").where("dedupe_key", "like", `weekly_digest:${week}:%`).whereIn("user_id", [chief2.id, admin.id]).count({ n: "*" }).first()).toMatchObject({ n: 0 });
    const again = await runWeeklyDigest();
    expect(again.queued).toBe(0);
    const [mail] = await mailsTo(chief.email, "Your Kalibore week");
    expect(mail.text).toContain("Records waiting for your approval:");
    expect(mail.text).toContain("Test Petrel, cylinder");
    expect(mail.text).toContain(`${APP}/notifications/preferences`);
  });

  it("npm run digest runs the same job from the command line, and a second run in the week sends nothing new", async () => {
    const { stdout } = await promisify(execFile)("npm", ["run", "--silent", "digest"], { cwd: path.resolve(import.meta.dirname, "../.."), env: process.env, timeout: 60_000 });
    expect(stdout).toMatch(new RegExp(`^weekly digest ${isoWeek(new Date())}: 0 queued for \\d+ people, \\d+ already queued this week`, "m"));
    await savePreferences(world.users.chief2, ["inspection_submitted", "inspection_returned", "unit_over_limit", "unit_horizon", "unit_probability", "weekly_digest"]);
  }, 90_000);
});
