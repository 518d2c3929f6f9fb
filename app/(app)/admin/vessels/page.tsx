import type { Metadata } from "next";
import Link from "next/link";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { listVesselsForAdmin } from "@/lib/admin/queries";
import { requirePermission } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Vessels" };

export default async function AdminVesselsPage() {
  await requirePermission("admin.fleet");
  const vessels = await listVesselsForAdmin();
  return (
    <>
      <PageHeader eyebrow="Administration" title="Vessels">
        <Link href="/admin/vessels/new" className={buttonClass("primary")}>Add vessel</Link>
      </PageHeader>
      {vessels.length === 0 ? (
        <Card className="p-5 text-ink-soft">No vessels yet.</Card>
      ) : (
        <div className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-raised">
          <table className="w-full text-sm">
            <thead className="bg-paper-sunk text-left text-xs uppercase tracking-wide text-ink-soft">
              <tr>
                <th scope="col" className="px-3 py-2">Vessel</th>
                <th scope="col" className="px-3 py-2">IMO</th>
                <th scope="col" className="hidden px-3 py-2 md:table-cell">Company</th>
                <th scope="col" className="hidden px-3 py-2 md:table-cell">Type · flag · built</th>
                <th scope="col" className="px-3 py-2 text-right">Engines</th>
                <th scope="col" className="hidden px-3 py-2 text-right sm:table-cell">People</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-ink-line/70">
              {vessels.map((v) => (
                <tr key={v.id}>
                  <td className="px-3 py-2.5">
                    <Link href={`/admin/vessels/${v.id}`} className="font-medium text-signal hover:underline">{v.name}</Link>
                    <div className="text-xs text-ink-faint md:hidden">{v.companyName}</div>
                  </td>
                  <td className="num px-3 py-2.5">{v.imoNumber}</td>
                  <td className="hidden px-3 py-2.5 md:table-cell">{v.companyName}</td>
                  <td className="hidden px-3 py-2.5 text-ink-soft md:table-cell">
                    {[v.vesselType, v.flag, v.builtYear].filter(Boolean).join(" · ") || "–"}
                  </td>
                  <td className="num px-3 py-2.5 text-right">
                    {v.engineCount === 0 ? (
                      <Link href={`/admin/engines/new?vesselId=${v.id}`} className="text-signal hover:underline">add</Link>
                    ) : (
                      v.engineCount
                    )}
                  </td>
                  <td className="num hidden px-3 py-2.5 text-right sm:table-cell">{v.peopleCount}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
