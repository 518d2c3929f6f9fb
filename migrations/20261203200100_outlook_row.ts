import type { Knex } from "knex";

// The few figures of the stored summary (and the fit of the stored detail) that the renewal
// outlook needs, kept by the database beside them as one small JSON object, so the outlook of
// a whole fleet reads a few hundred bytes per unit instead of parsing every summary.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`ALTER TABLE unit_analysis ADD COLUMN outlook_json TEXT AS (JSON_OBJECT(
    'nextOverhaulEngineHours', JSON_EXTRACT(summary, '$.nextOverhaulEngineHours'),
    'linerHours', JSON_EXTRACT(summary, '$.linerHours'),
    'lastInspectedOn', JSON_EXTRACT(summary, '$.lastInspectedOn'),
    'lastEngineHours', JSON_EXTRACT(summary, '$.lastEngineHours'),
    'maxWearMm', JSON_EXTRACT(summary, '$.maxWearMm'),
    'runningRate', JSON_EXTRACT(summary, '$.runningRate'),
    'ringsRenew', JSON_EXTRACT(summary, '$.rings[*].renew'),
    'ringsOverLimit', JSON_EXTRACT(summary, '$.rings[*].overLimit'),
    'fit', JSON_EXTRACT(detail, '$.fit')
  )) PERSISTENT`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw("ALTER TABLE unit_analysis DROP COLUMN outlook_json");
}
