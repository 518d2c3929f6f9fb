/**
 * npm run migrate runs this after the migrations: as the schema's owner (DB_MIGRATION_USER),
 * grants the app's user (DB_USER) its table privileges — the audit trail append-only. Does
 * nothing when no separate owner is configured (then the app user owns the schema).
 */
import knex from "knex";
import config from "../knexfile";
import { parseServerEnv } from "../lib/env";
import { appUserHosts, grantAppUser } from "./lib/app-grants";

const env = parseServerEnv(process.env);
if (!env.DB_MIGRATION_USER || env.DB_MIGRATION_USER === env.DB_USER) {
  console.log("db-grants: no separate DB_MIGRATION_USER; the app user owns the schema, nothing to grant");
} else {
  const db = knex({ ...config, pool: { min: 0, max: 1 } });
  try {
    const { tables } = await grantAppUser(db, { database: env.DB_NAME, appUser: env.DB_USER, hosts: appUserHosts() });
    console.log(`db-grants: ${env.DB_USER} may read and write ${tables} tables of ${env.DB_NAME}; audit_log only read and append`);
  } finally {
    await db.destroy();
  }
}
