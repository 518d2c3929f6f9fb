// Builds the role test world in DB_NAME (for checking screens by hand):
//   DB_NAME=kalibore_roles_dev npx tsx tests/support/build-role-world-cli.ts
import knex from "knex";
import { buildRoleWorld } from "./role-world";

const name = process.env.DB_NAME ?? "";
if (!name || name === "kalibore") throw new Error("Set DB_NAME to a scratch database (not the demo database).");
const db = knex({
  client: "mysql2",
  connection: {
    host: process.env.DB_HOST ?? "127.0.0.1",
    port: Number(process.env.DB_PORT ?? 3307),
    user: process.env.DB_USER ?? "kalibore",
    password: process.env.DB_PASSWORD ?? "kalibore-local",
    database: name,
    timezone: "Z",
  },
});
const world = await buildRoleWorld(db);
console.log(JSON.stringify({ vessel1: world.vessel1, vessel2: world.vessel2, users: Object.fromEntries(Object.entries(world.users).map(([k, u]) => [k, u.email])) }, null, 2));
await db.destroy();
