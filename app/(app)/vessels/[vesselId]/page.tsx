import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { Card, PageHeader } from "@/components/ui/card";
import { requireRecordInScope } from "@/lib/auth/record-scope";
import { can } from "@/lib/auth/permissions";
import { requirePermission } from "@/lib/auth/session";
import { getVessel } from "@/lib/fleet/queries";
import { fixed } from "@/lib/format";

export const metadata: Metadata = { title: "Vessel" };

export default async function VesselPage({ params }: { params: Promise<{ vesselId: string }> }) {
  const user = await requirePermission("fleet.read");
  const { vesselId } = await params;
  const vessel = await getVessel(user, await requireRecordInScope("vessel", vesselId));
  if (!vessel) notFound();
  return (
    <>
      <PageHeader
        eyebrow={
          <>
            <Link href="/fleet" className="hover:underline">Fleet</Link> / {vessel.companyName}
          </>
        }
        title={vessel.name}
      />
      <dl className="mb-6 grid grid-cols-2 gap-4 text-sm sm:grid-cols-4">
        <div><dt className="text-xs text-ink-faint">IMO number</dt><dd className="num font-medium">{vessel.imoNumber}</dd></div>
        <div><dt className="text-xs text-ink-faint">Type</dt><dd>{vessel.vesselType ?? "–"}</dd></div>
        <div><dt className="text-xs text-ink-faint">Flag</dt><dd>{vessel.flag ?? "–"}</dd></div>
        <div><dt className="text-xs text-ink-faint">Built</dt><dd className="num">{vessel.builtYear ?? "–"}</dd></div>
      </dl>
      <h2 className="mb-3 text-lg font-semibold">Main engine</h2>
      {vessel.engines.length === 0 ? (
        <Card className="p-5 text-ink-soft">No main engine is recorded for this vessel.</Card>
      ) : (
        <ul className="grid gap-4 md:grid-cols-2">
          {vessel.engines.map((e) => (
            <li key={e.id}>
              <Card className="p-5">
                <h3 className="font-semibold">
                  <Link href={`/engines/${e.id}`} className="hover:text-signal hover:underline">
                    {e.designation} · serial {e.serial}
                  </Link>
                </h3>
                <p className="mt-1 text-sm text-ink-soft">
                  <span className="num">{e.cylinderCount}</span> cylinders · <span className="num">{fixed(e.boreMm, 0)} mm</span> bore ·
                  profile “{e.profileName}”
                </p>
                <div className="mt-3 flex flex-wrap gap-x-4">
                  <Link href={`/engines/${e.id}`} className="inline-flex min-h-11 items-center text-sm font-medium text-signal hover:underline">
                    Units and wear →
                  </Link>
                  {can(user.role, "import.create") ? (
                    <Link href={`/imports/new?history=1&engine=${e.id}`} className="inline-flex min-h-11 items-center text-sm font-medium text-signal hover:underline">
                      Import past records →
                    </Link>
                  ) : null}
                </div>
              </Card>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
