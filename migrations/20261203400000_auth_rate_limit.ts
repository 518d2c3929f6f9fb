import type { Knex } from "knex";

// better-auth's per-address request counts (sign-in, password reset), kept in the database rather
// than in one process's memory, so every app instance behind a balancer counts against the same
// limit. The table as better-auth's schema generator writes it for MySQL/MariaDB.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(
    "create table `rateLimit` (`id` varchar(36) not null primary key, `key` varchar(255) not null unique, `count` integer not null, `lastRequest` bigint not null) default charset utf8mb4 collate utf8mb4_unicode_ci",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("rateLimit");
}
