import type { Metadata } from "next";
import { CompanySettingsForm } from "@/components/admin/company-settings-form";
import { Card, PageHeader } from "@/components/ui/card";
import { requirePermission } from "@/lib/auth/session";
import { listCompanySettings } from "@/lib/company/settings";

export const metadata: Metadata = { title: "Companies" };

export default async function AdminCompaniesPage() {
  await requirePermission("admin.fleet");
  const companies = await listCompanySettings();
  return (
    <>
      <PageHeader eyebrow="Administration" title="Companies" />
      <p className="mb-5 max-w-2xl text-sm text-ink-soft">
        Each managing company keeps its own currency for costs and decides when its people hear about a liner or ring set
        approaching its limit. A company is added with its first vessel.
      </p>
      {companies.length === 0 ? (
        <Card className="p-5 text-ink-soft">No companies yet. Add a vessel to create one.</Card>
      ) : (
        <div className="space-y-5">
          {companies.map((c) => (
            <Card key={c.companyId} className="p-4 sm:p-5">
              <h2 className="mb-4 text-lg font-semibold">{c.companyName}</h2>
              <CompanySettingsForm
                initial={{
                  companyId: c.companyId,
                  currencyCode: c.currencyCode,
                  alertHorizonDays: c.alertHorizonDays,
                  alertPercent: Math.round(c.alertProbability * 100),
                }}
              />
            </Card>
          ))}
        </div>
      )}
    </>
  );
}
