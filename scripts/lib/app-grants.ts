import type { Knex } from "knex";

/** Tables the app may read and add to but never change or delete from: the audit trail is append-only. */
export const APPEND_ONLY_TABLES = ["audit_log"] as const;

/** The migration bookkeeping: the app reads it (to tell an out-of-date schema), only the owner writes it. */
const READ_ONLY_TABLES = ["knex_migrations", "knex_migrations_lock"];

const ident = (name: string) => {
  if (!/^[A-Za-z0-9_]+$/.test(name)) throw new Error(`Refusing an unusual identifier: ${name}`);
  return `\`${name}\``;
};
const account = (user: string, host: string) => `'${user.replace(/'/g, "''")}'@'${host.replace(/'/g, "''")}'`;

/**
 * Gives the app's database user exactly what it needs, table by table, as the schema's owner
 * (who holds GRANT OPTION on the database): SELECT, INSERT, UPDATE, DELETE on every table but
 * the append-only audit trail (SELECT, INSERT) and the migration bookkeeping (SELECT). Grants
 * are per table because MariaDB privileges only add up: a database-wide UPDATE would cover
 * audit_log too. Run after every migration, so a new table is granted too; a privilege the user
 * held before on audit_log (UPDATE, DELETE) is taken back.
 */
export async function grantAppUser(
  db: Knex,
  opts: { database: string; appUser: string; hosts: readonly string[] },
): Promise<{ tables: number }> {
  const tables = (
    await db("information_schema.TABLES").where({ TABLE_SCHEMA: opts.database, TABLE_TYPE: "BASE TABLE" }).select<{ name: string }[]>("TABLE_NAME as name")
  ).map((r) => r.name);
  const dbName = ident(opts.database);
  for (const host of opts.hosts) {
    const to = account(opts.appUser, host);
    for (const table of tables) {
      const t = `${dbName}.${ident(table)}`;
      if ((APPEND_ONLY_TABLES as readonly string[]).includes(table)) {
        await db.raw(`GRANT SELECT, INSERT ON ${t} TO ${to}`);
        await db.raw(`REVOKE UPDATE, DELETE ON ${t} FROM ${to}`).catch(() => undefined); // none held: nothing to take back
      } else if (READ_ONLY_TABLES.includes(table)) {
        await db.raw(`GRANT SELECT ON ${t} TO ${to}`);
      } else {
        await db.raw(`GRANT SELECT, INSERT, UPDATE, DELETE ON ${t} TO ${to}`);
      }
    }
  }
  return { tables: tables.length };
}

/** The hosts the app user is defined for in the private MariaDB the scripts start (see scripts/lib/common.sh). */
export function appUserHosts(value = process.env.DB_APP_USER_HOSTS): string[] {
  return (value ?? "127.0.0.1,localhost").split(",").map((h) => h.trim()).filter(Boolean);
}
