import type { Knex } from "knex";

// The id the device gave its last accepted draft save. A device whose answer was lost
// (saved on the server, never heard on the tablet) finds its own id here on its next try
// and carries on from the server's revision, instead of seeing a conflict with itself.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("inspections", (t) => {
    t.string("last_save_id", 64).nullable().after("revision");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("inspections", (t) => {
    t.dropColumn("last_save_id");
  });
}
