import "server-only";
import { getCompanySettings } from "@/lib/company/settings";

/** The currency (ISO 4217) of each company's costs, from the company settings. */
export async function currenciesOf(companyIds: readonly number[]): Promise<Map<number, string>> {
  const out = new Map<number, string>();
  for (const id of new Set(companyIds)) {
    const s = await getCompanySettings(id);
    if (s) out.set(id, s.currencyCode);
  }
  return out;
}
