import type { Knex } from "knex";

// Tables of better-auth (users, sessions, accounts, verification tokens), as its
// schema generator writes them for MySQL/MariaDB, kept here so migrations/ is the
// one schema history. Regenerate with `node --conditions=react-server --import tsx scripts/auth-schema.ts`.
const statements = [
  "create table `user` (`id` varchar(36) not null primary key, `name` varchar(255) not null, `email` varchar(255) not null unique, `emailVerified` boolean not null, `image` text, `createdAt` timestamp(3) default CURRENT_TIMESTAMP(3) not null, `updatedAt` timestamp(3) default CURRENT_TIMESTAMP(3) not null, `role` text, `banned` boolean, `banReason` text, `banExpires` timestamp(3)) default charset utf8mb4 collate utf8mb4_unicode_ci",
  "create table `session` (`id` varchar(36) not null primary key, `expiresAt` timestamp(3) not null, `token` varchar(255) not null unique, `createdAt` timestamp(3) default CURRENT_TIMESTAMP(3) not null, `updatedAt` timestamp(3) not null, `ipAddress` text, `userAgent` text, `userId` varchar(36) not null, `impersonatedBy` text, constraint `session_userId_fk` foreign key (`userId`) references `user` (`id`) on delete cascade) default charset utf8mb4 collate utf8mb4_unicode_ci",
  "create table `account` (`id` varchar(36) not null primary key, `accountId` text not null, `providerId` text not null, `userId` varchar(36) not null, `accessToken` text, `refreshToken` text, `idToken` text, `accessTokenExpiresAt` timestamp(3), `refreshTokenExpiresAt` timestamp(3), `scope` text, `password` text, `createdAt` timestamp(3) default CURRENT_TIMESTAMP(3) not null, `updatedAt` timestamp(3) not null, constraint `account_userId_fk` foreign key (`userId`) references `user` (`id`) on delete cascade) default charset utf8mb4 collate utf8mb4_unicode_ci",
  "create table `verification` (`id` varchar(36) not null primary key, `identifier` varchar(255) not null, `value` text not null, `expiresAt` timestamp(3) not null, `createdAt` timestamp(3) default CURRENT_TIMESTAMP(3) not null, `updatedAt` timestamp(3) default CURRENT_TIMESTAMP(3) not null) default charset utf8mb4 collate utf8mb4_unicode_ci",
  "create index `session_userId_idx` on `session` (`userId`)",
  "create index `account_userId_idx` on `account` (`userId`)",
  "create index `verification_identifier_idx` on `verification` (`identifier`)",
];

export async function up(knex: Knex): Promise<void> {
  for (const sql of statements) await knex.raw(sql);
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ["verification", "account", "session", "user"]) await knex.schema.dropTableIfExists(table);
}
