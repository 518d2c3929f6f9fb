import "server-only";
import type { Knex } from "knex";
import { ActionError } from "@/lib/auth/action-error";
import { writeAudit } from "@/lib/audit/mutations";
import { db as defaultDb } from "@/lib/db/knex";
import type { CompanySettingsValues } from "./schemas";
import { inTransaction } from "@/lib/db/transaction";

type Actor = { id: string; name: string };

export type CompanySettings = {
  companyId: number;
  companyName: string;
  /** ISO 4217 code of every cost figure (spares, renewal jobs, budgets). */
  currencyCode: string;
  /** An alert is due when the early end of a unit's projected interval comes within this many days. */
  alertHorizonDays: number;
  /** An alert is due when the probability of passing the limit by the next overhaul reaches this (0–1). */
  alertProbability: number;
};

type Row = { id: number; name: string; currency_code: string; alert_horizon_days: number; alert_probability: number | string };

const COLUMNS = ["id", "name", "currency_code", "alert_horizon_days", "alert_probability"] as const;

const toSettings = (r: Row): CompanySettings => ({
  companyId: r.id,
  companyName: r.name,
  currencyCode: r.currency_code,
  alertHorizonDays: Number(r.alert_horizon_days),
  alertProbability: Number(r.alert_probability),
});

/** One company's settings, or null when there is no such company. */
export async function getCompanySettings(companyId: number, db: Knex | Knex.Transaction = defaultDb): Promise<CompanySettings | null> {
  const row = await db("companies").where({ id: companyId }).first<Row | undefined>(COLUMNS);
  return row ? toSettings(row) : null;
}

/** The settings of the company that manages a vessel, or null when there is no such vessel. */
export async function getVesselCompanySettings(vesselId: number, db: Knex | Knex.Transaction = defaultDb): Promise<CompanySettings | null> {
  const row = await db("companies")
    .join("vessels", "vessels.company_id", "companies.id")
    .where("vessels.id", vesselId)
    .first<Row | undefined>(COLUMNS.map((c) => `companies.${c}`));
  return row ? toSettings(row) : null;
}

/** Every company's settings, by name (for the administrator). */
export async function listCompanySettings(db: Knex = defaultDb): Promise<CompanySettings[]> {
  const rows = await db("companies").orderBy("name").select<Row[]>(COLUMNS);
  return rows.map(toSettings);
}

/** Saves a company's settings (values already parsed by `companySettingsSchema`), audited. */
export async function updateCompanySettings(actor: Actor, v: CompanySettingsValues, db: Knex = defaultDb): Promise<CompanySettings> {
  return inTransaction(db, async (trx) => {
    const before = await getCompanySettings(v.companyId, trx);
    if (!before) throw new ActionError("That company no longer exists.", {}, "not_found");
    const row = { currency_code: v.currencyCode, alert_horizon_days: v.alertHorizonDays, alert_probability: v.alertPercent / 100 };
    await trx("companies").where({ id: v.companyId }).update(row);
    await writeAudit(
      {
        actor,
        action: "company.settings",
        entityType: "company",
        entityId: v.companyId,
        detail: { before: { currency_code: before.currencyCode, alert_horizon_days: before.alertHorizonDays, alert_probability: before.alertProbability }, after: row },
      },
      trx,
    );
    return (await getCompanySettings(v.companyId, trx))!;
  });
}
