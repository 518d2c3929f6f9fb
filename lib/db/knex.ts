import "server-only";
import knex, { type Knex } from "knex";
import { serverEnv } from "@/lib/env";

/** Connection settings shared by the app, the seed script and the tests. */
export function knexConfig(overrides: Partial<{ database: string; port: number }> = {}): Knex.Config {
  return {
    client: "mysql2",
    connection: {
      host: serverEnv.DB_HOST,
      port: overrides.port ?? serverEnv.DB_PORT,
      user: serverEnv.DB_USER,
      password: serverEnv.DB_PASSWORD,
      database: overrides.database ?? serverEnv.DB_NAME,
      charset: "utf8mb4",
      timezone: "Z",
      // DATE columns come back as 'YYYY-MM-DD' strings: a calendar day has no time zone.
      dateStrings: ["DATE"] as unknown as boolean,
      decimalNumbers: true,
    },
    pool: { min: 0, max: serverEnv.DB_POOL_MAX },
  };
}

const globalForDb = globalThis as unknown as { kaliboreDb?: Knex };

/** The one Knex instance; cached on globalThis so dev reloads do not leak pools. */
export const db: Knex = globalForDb.kaliboreDb ?? knex(knexConfig());
if (process.env.NODE_ENV !== "production") globalForDb.kaliboreDb = db;
