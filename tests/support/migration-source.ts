import type { Knex } from "knex";

type MigrationModule = { up: (k: Knex) => Promise<void>; down: (k: Knex) => Promise<void> };

// Vite bundles the TypeScript migrations for the tests; names match the files so the
// knex_migrations table agrees with the CLI that `npm start` uses.
const modules = import.meta.glob<MigrationModule>("../../migrations/*.ts", { eager: true });

export const migrationSource: Knex.MigrationSource<string> = {
  async getMigrations() {
    return Object.keys(modules).sort();
  },
  getMigrationName(path) {
    return path.split("/").pop()!;
  },
  async getMigration(path) {
    return modules[path];
  },
};
