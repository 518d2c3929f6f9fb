import type { Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { inTransaction } from "@/lib/db/transaction";
import { testDb } from "../support/db";

/**
 * The one transaction helper (lib/db/transaction.ts) against a real MariaDB: a real deadlock is
 * run again and lands once; a lost connection is run again only where the work is idempotent.
 */
describe("inTransaction", () => {
  let db: Knex;
  beforeAll(async () => {
    db = testDb();
    await db.schema.dropTableIfExists("retry_probe");
    await db.schema.createTable("retry_probe", (t) => {
      t.integer("id").primary();
      t.integer("n").notNullable();
    });
    await db("retry_probe").insert([{ id: 1, n: 0 }, { id: 2, n: 0 }]);
  });
  afterAll(async () => {
    await db.schema.dropTableIfExists("retry_probe");
    await db.destroy();
  });

  it("runs a transaction the server chose as a deadlock victim (ER_LOCK_DEADLOCK 1213) again, and each lands once", async () => {
    let runs = 0;
    let release!: () => void;
    const bothLocked = new Promise<void>((r) => (release = r));
    let locked = 0;
    const crossed = (first: number, second: number) =>
      inTransaction(db, async (trx) => {
        runs++;
        await trx("retry_probe").where({ id: first }).increment("n", 1);
        if (++locked === 2) release();
        await bothLocked; // both hold one row: each now wants the other's
        await trx("retry_probe").where({ id: second }).increment("n", 1);
      });
    await Promise.all([crossed(1, 2), crossed(2, 1)]);
    expect(runs).toBe(3); // two first runs, one of them the victim, run once more
    expect(await db("retry_probe").orderBy("id").pluck("n")).toEqual([2, 2]);
  });

  it("does not repeat a plain error (a duplicate key is the caller's answer)", async () => {
    let runs = 0;
    await expect(
      inTransaction(db, async (trx) => {
        runs++;
        await trx("retry_probe").insert({ id: 1, n: 9 });
      }),
    ).rejects.toMatchObject({ code: "ER_DUP_ENTRY" });
    expect(runs).toBe(1);
  });

  const killOwnConnection = async (trx: Knex.Transaction) => {
    const [[{ id }]] = (await trx.raw("SELECT CONNECTION_ID() AS id")) as [[{ id: number }]];
    const killer = testDb();
    await killer.raw(`KILL CONNECTION ${Number(id)}`);
    await killer.destroy();
    await trx("retry_probe").where({ id: 2 }).increment("n", 1);
  };

  it("hands a connection lost mid-transaction to the caller when the work is not idempotent", async () => {
    let runs = 0;
    const before = await db("retry_probe").where({ id: 2 }).first("n");
    await expect(
      inTransaction(db, async (trx) => {
        runs++;
        await killOwnConnection(trx);
      }),
    ).rejects.toMatchObject({ fatal: true });
    expect(runs).toBe(1);
    expect(await db("retry_probe").where({ id: 2 }).first("n")).toEqual(before);
  });

  it("runs idempotent work again on a fresh connection after the connection was lost", async () => {
    let runs = 0;
    const before = (await db("retry_probe").where({ id: 2 }).first("n")).n as number;
    await inTransaction(
      db,
      async (trx) => {
        runs++;
        if (runs === 1) await killOwnConnection(trx);
        else await trx("retry_probe").where({ id: 2 }).increment("n", 1);
      },
      { idempotent: true },
    );
    expect(runs).toBe(2);
    expect((await db("retry_probe").where({ id: 2 }).first("n")).n).toBe(before + 1);
  });
});
