import knex, { type Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

/**
 * The audit trail is append-only for the application: its database user (scripts/test.sh creates
 * it as npm start does, with the grants of scripts/lib/app-grants.ts) may add and read audit rows
 * but the server refuses it any change or removal of one, whatever the code asks for.
 */
describe("the app's database user and the audit trail", () => {
  let app: Knex;
  let auditId: number;

  beforeAll(async () => {
    const user = process.env.TEST_APP_DB_USER;
    if (!user) throw new Error("TEST_APP_DB_USER is not set: run through scripts/test.sh, which creates the app's user");
    app = knex({
      client: "mysql2",
      connection: {
        host: process.env.DB_HOST ?? "127.0.0.1",
        port: Number(process.env.DB_PORT ?? 3317),
        user,
        password: process.env.TEST_APP_DB_PASSWORD,
        database: process.env.DB_NAME ?? "kalibore_it",
      },
      pool: { min: 0, max: 1 },
    });
    [auditId] = await app("audit_log").insert({ action: "test.append", entity_type: "test", entity_id: "1" });
  });
  afterAll(async () => {
    await app?.destroy();
  });

  it("may append and read audit rows", async () => {
    const row = await app("audit_log").where({ id: auditId }).first("action");
    expect(row?.action).toBe("test.append");
  });

  it("is refused an UPDATE of an audit row by the server (ER_TABLEACCESS_DENIED_ERROR)", async () => {
    await expect(app("audit_log").where({ id: auditId }).update({ action: "test.rewritten" })).rejects.toMatchObject({ code: "ER_TABLEACCESS_DENIED_ERROR", errno: 1142 });
    expect((await app("audit_log").where({ id: auditId }).first("action"))?.action).toBe("test.append");
  });

  it("is refused a DELETE, a TRUNCATE and a DROP of the audit trail", async () => {
    await expect(app("audit_log").where({ id: auditId }).delete()).rejects.toMatchObject({ errno: 1142 });
    await expect(app.raw("TRUNCATE TABLE audit_log")).rejects.toMatchObject({ errno: 1142 });
    await expect(app.raw("DROP TABLE audit_log")).rejects.toMatchObject({ errno: 1142 });
    expect(await app("audit_log").where({ id: auditId }).first("id")).toBeDefined();
  });

  it("still changes and deletes the records themselves (the grants are per table, not a read-only user)", async () => {
    const [id] = await app("mail_outbox").insert({ to_address: "grant@test.example", subject: "s", text_body: "t", kind: "test" });
    expect(await app("mail_outbox").where({ id }).update({ subject: "s2" })).toBe(1);
    expect(await app("mail_outbox").where({ id }).delete()).toBe(1);
  });
});
