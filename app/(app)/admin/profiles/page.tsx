import type { Metadata } from "next";
import Link from "next/link";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { listProfilesForAdmin } from "@/lib/admin/queries";
import { requirePermission } from "@/lib/auth/session";
import { fixed } from "@/lib/format";

export const metadata: Metadata = { title: "Engine profiles" };

export default async function AdminProfilesPage() {
  await requirePermission("admin.profiles");
  const profiles = await listProfilesForAdmin();
  return (
    <>
      <PageHeader eyebrow="Administration" title="Engine profiles">
        <Link href="/admin/profiles/new" className={buttonClass("primary")}>Add profile</Link>
      </PageHeader>
      {profiles.length === 0 ? (
        <Card className="p-5 text-ink-soft">No engine profiles yet. A profile holds one engine design&apos;s bore, gauging stations and limits.</Card>
      ) : (
        <div className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-raised">
          <table className="w-full text-sm">
            <thead className="bg-paper-sunk text-left text-xs uppercase tracking-wide text-ink-soft">
              <tr>
                <th scope="col" className="px-3 py-2">Profile</th>
                <th scope="col" className="px-3 py-2 text-right">Bore</th>
                <th scope="col" className="hidden px-3 py-2 text-right sm:table-cell">Wear limit</th>
                <th scope="col" className="hidden px-3 py-2 text-right sm:table-cell">Ovality limit</th>
                <th scope="col" className="hidden px-3 py-2 text-right md:table-cell">Stations</th>
                <th scope="col" className="hidden px-3 py-2 text-right md:table-cell">Rings</th>
                <th scope="col" className="px-3 py-2 text-right">Engines</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-ink-line/70">
              {profiles.map((p) => (
                <tr key={p.id}>
                  <td className="px-3 py-2.5">
                    <Link href={`/admin/profiles/${p.id}`} className="font-medium text-signal hover:underline">{p.name}</Link>
                    <div className="text-xs text-ink-faint">{p.designation}</div>
                  </td>
                  <td className="num px-3 py-2.5 text-right">{fixed(p.boreMm, 0)} mm</td>
                  <td className="num hidden px-3 py-2.5 text-right sm:table-cell">{fixed(p.linerWearLimitMm)} mm</td>
                  <td className="num hidden px-3 py-2.5 text-right sm:table-cell">{fixed(p.ovalityLimitMm)} mm</td>
                  <td className="num hidden px-3 py-2.5 text-right md:table-cell">{p.stationCount}</td>
                  <td className="num hidden px-3 py-2.5 text-right md:table-cell">{p.ringCount}</td>
                  <td className="num px-3 py-2.5 text-right">{p.engineCount}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
