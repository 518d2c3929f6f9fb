import type { Metadata } from "next";
import Link from "next/link";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { listEnginesForAdmin } from "@/lib/admin/queries";
import { requirePermission } from "@/lib/auth/session";
import { day } from "@/lib/format";

export const metadata: Metadata = { title: "Main engines" };

export default async function AdminEnginesPage() {
  await requirePermission("admin.fleet");
  const engines = await listEnginesForAdmin();
  return (
    <>
      <PageHeader eyebrow="Administration" title="Main engines">
        <Link href="/admin/engines/new" className={buttonClass("primary")}>Add engine</Link>
      </PageHeader>
      {engines.length === 0 ? (
        <Card className="p-5 text-ink-soft">No main engines yet.</Card>
      ) : (
        <div className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-raised">
          <table className="w-full text-sm">
            <thead className="bg-paper-sunk text-left text-xs uppercase tracking-wide text-ink-soft">
              <tr>
                <th scope="col" className="px-3 py-2">Vessel</th>
                <th scope="col" className="px-3 py-2">Serial</th>
                <th scope="col" className="hidden px-3 py-2 sm:table-cell">Profile</th>
                <th scope="col" className="px-3 py-2 text-right">Cylinders</th>
                <th scope="col" className="hidden px-3 py-2 md:table-cell">In service since</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-ink-line/70">
              {engines.map((e) => (
                <tr key={e.id}>
                  <td className="px-3 py-2.5">
                    <Link href={`/engines/${e.id}`} className="font-medium text-signal hover:underline">{e.vesselName}</Link>
                    <div className="text-xs text-ink-faint sm:hidden">{e.designation}</div>
                  </td>
                  <td className="px-3 py-2.5 font-mono text-xs">{e.serial}</td>
                  <td className="hidden px-3 py-2.5 sm:table-cell">
                    <Link href={`/admin/profiles/${e.profileId}`} className="hover:underline">{e.profileName}</Link>
                    <span className="text-ink-faint"> · {e.designation}</span>
                  </td>
                  <td className="num px-3 py-2.5 text-right">{e.cylinderCount}</td>
                  <td className="num hidden px-3 py-2.5 md:table-cell">{day(e.commissionedOn)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
