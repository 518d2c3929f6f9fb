import knex from "knex";
import { testDb } from "./db";
import { appUserHosts, grantAppUser } from "../../scripts/lib/app-grants";
import { migrationSource } from "./migration-source";

/**
 * Integration tests run against a real MariaDB started by scripts/test.sh. This
 * recreates the test database from nothing and migrates it, once per run.
 */
export default async function setup() {
  const name = process.env.DB_NAME ?? "kalibore_it";
  if (!/_it$/.test(name)) throw new Error(`Refusing to reset database "${name}": integration tests only use *_it databases.`);
  const host = process.env.DB_HOST ?? "127.0.0.1";
  if (host !== "127.0.0.1" && host !== "localhost") throw new Error(`Refusing a non-local database host ${host}.`);
  const admin = knex({
    client: "mysql2",
    connection: { host, port: Number(process.env.DB_PORT ?? 3317), user: process.env.DB_USER, password: process.env.DB_PASSWORD },
  });
  await admin.raw(`DROP DATABASE IF EXISTS \`${name}\``);
  await admin.raw(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await admin.destroy();
  const db = testDb(name);
  await db.migrate.latest({ migrationSource });
  // The app's own user (scripts/test.sh creates it) gets its table grants, as npm start gives them.
  if (process.env.TEST_APP_DB_USER) await grantAppUser(db, { database: name, appUser: process.env.TEST_APP_DB_USER, hosts: appUserHosts() });
  await db.destroy();
}
