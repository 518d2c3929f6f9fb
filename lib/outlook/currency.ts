import "server-only";

/**
 * The currency the budget is shown in. Placeholder until the company settings land
 * (lib/company/settings.ts, getCompanySettings(companyId).currencyCode).
 */
export async function currencyOf(_companyId: number | null): Promise<string> {
  return "EUR";
}
