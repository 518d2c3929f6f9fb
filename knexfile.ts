import nextEnv from "@next/env";
import type { Knex } from "knex";

nextEnv.loadEnvConfig(process.cwd());

const { parseServerEnv } = await import("./lib/env");
const env = parseServerEnv(process.env);

const config: Knex.Config = {
  client: "mysql2",
  connection: {
    host: env.DB_HOST,
    port: env.DB_PORT,
    // Migrations and the seed run as the schema's owner; the app's own user may not alter tables.
    user: env.DB_MIGRATION_USER ?? env.DB_USER,
    password: env.DB_MIGRATION_USER ? env.DB_MIGRATION_PASSWORD : env.DB_PASSWORD,
    database: env.DB_NAME,
    charset: "utf8mb4",
    timezone: "Z",
    dateStrings: ["DATE"] as unknown as boolean,
  },
  migrations: { directory: "./migrations", extension: "ts", loadExtensions: [".ts"], tableName: "knex_migrations" },
};

export default config;
