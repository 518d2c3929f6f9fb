// Prints the SQL better-auth needs, for pasting into a Knex migration (one schema history).
import { getMigrations } from "better-auth/db/migration";
const { auth } = await import("../lib/auth/auth");
const { compileMigrations } = await getMigrations(auth.options);
console.log(await compileMigrations());
process.exit(0);
