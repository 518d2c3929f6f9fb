import { randomUUID } from "node:crypto";
import { existsSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { simpleParser } from "mailparser";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { db } from "@/lib/db/knex";
import { drainOutbox, outboxIdle, queueMail } from "@/lib/mail/outbox";
import { mailer } from "@/lib/mail/transport";
import { call, startAuthServer, type AuthServer } from "../support/auth-server";

// A password-reset request is answered before any mail is sent, so the answer for an
// address with an account cannot be told from the answer for one without by how long it
// takes: the mail waits in mail_outbox and the sender delivers it afterwards.
const MAIL_DIR = process.env.MAIL_FAKE_DIR ?? path.resolve(".test-data/mail");
let server: AuthServer;
let known: string;

beforeAll(async () => {
  server = await startAuthServer();
  const id = randomUUID();
  known = `reset-${Date.now().toString(36)}@mail.test`;
  const now = new Date();
  await db("user").insert({ id, name: "Rita Reset", email: known, emailVerified: true, role: "engineer", banned: false, createdAt: now, updatedAt: now });
});
afterAll(() => server.close());

const ask = (email: string, from: string) =>
  call(server, "POST", "/api/auth/request-password-reset", { from, body: { email, redirectTo: "/reset-password" } });

function within<T>(ms: number, p: Promise<T>, what: string): Promise<T> {
  return Promise.race([p, new Promise<T>((_, reject) => setTimeout(() => reject(new Error(`${what} took longer than ${ms} ms`)), ms))]);
}

async function mailTo(address: string, timeoutMs = 10_000): Promise<string | null> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (existsSync(MAIL_DIR)) {
      for (const f of readdirSync(MAIL_DIR)) {
        const raw = readFileSync(path.join(MAIL_DIR, f), "utf8");
        if (raw.includes(address)) return raw;
      }
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  return null;
}

describe("password-reset mail", () => {
  it("answers a known and an unknown address alike while the mail server does not answer at all", async () => {
    let release!: () => void;
    const hung = new Promise<never>((_, reject) => (release = () => reject(new Error("mail server did not answer"))));
    hung.catch(() => {});
    const send = vi.spyOn(mailer, "sendMail").mockImplementation(() => hung);
    try {
      const a = await within(5000, ask(known, "127.0.5.1"), "the answer for a known address");
      const b = await within(5000, ask(`nobody-${Date.now()}@mail.test`, "127.0.5.2"), "the answer for an unknown address");
      expect([a.status, b.status]).toEqual([200, 200]);
      expect(a.body).toBe(b.body);
      // The known address's mail is queued (and the sender is stuck on the mail server, not the answer).
      await vi.waitFor(async () => expect(await db("mail_outbox").where({ to_address: known, kind: "password_reset" }).first("status")).toBeDefined(), { timeout: 5000 });
    } finally {
      send.mockRestore();
      release();
      await outboxIdle();
    }
    const row = await db("mail_outbox").where({ to_address: known, kind: "password_reset" }).orderBy("id", "desc").first();
    expect(row).toMatchObject({ kind: "password_reset", attempts: 1 });
    // Either the sender gave up on the silent server (kept for a retry), or, on a busy machine, the
    // server answered once released before the sender's own time-out: never lost, never sent twice.
    expect([row.status, row.last_error]).toSatisfy(
      ([status, error]: [string, string | null]) => (status === "pending" && error === "mail server did not answer") || (status === "sent" && error === null),
    );
  });

  it("delivers the queued mail to the mail server when it answers again, with a working link", async () => {
    // The retry is due 30 s after the failure; the sender is asked as if that time had come.
    await drainOutbox({ now: () => new Date(Date.now() + 60_000) });
    const row = await db("mail_outbox").where({ to_address: known, kind: "password_reset" }).orderBy("id", "desc").first();
    expect(row).toMatchObject({ status: "sent", last_error: null });
    expect(row.attempts).toBeGreaterThanOrEqual(1);
    expect(row.attempts).toBeLessThanOrEqual(2);
    const raw = await mailTo(known);
    expect(raw, `no mail to ${known} in ${MAIL_DIR}`).not.toBeNull();
    const parsed = await simpleParser(raw!);
    expect(parsed.subject).toBe("Reset your Kalibore password");
    const token = /\/reset-password\?token=([A-Za-z0-9_-]+)/.exec(parsed.text ?? "")?.[1];
    expect(token).toBeTruthy();
    expect(await db("verification").where({ identifier: `reset-password:${token}` }).first()).toBeDefined();
  });

  it("queues mail with a dedupe key once only", async () => {
    const key = `digest-${randomUUID()}`;
    const mail = { to: "someone@mail.test", subject: "Weekly", text: "t", html: "<p>t</p>", kind: "test", dedupeKey: key };
    expect(await queueMail(mail)).toBe(true);
    expect(await queueMail(mail)).toBe(false);
    expect(await db("mail_outbox").where({ dedupe_key: key }).count({ n: "*" }).first()).toMatchObject({ n: 1 });
  });
});
