import knex, { type Knex } from "knex";

/** A Knex connection to the integration database that scripts/test.sh started. */
export function testDb(database = process.env.DB_NAME ?? "kalibore_it"): Knex {
  return knex({
    client: "mysql2",
    connection: {
      host: process.env.DB_HOST ?? "127.0.0.1",
      port: Number(process.env.DB_PORT ?? 3317),
      user: process.env.DB_USER,
      password: process.env.DB_PASSWORD,
      database,
      timezone: "Z",
      dateStrings: ["DATE"] as unknown as boolean,
      decimalNumbers: true,
    },
    pool: { min: 0, max: 4 },
  });
}
