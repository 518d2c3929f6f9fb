import type { Metadata } from "next";
import Link from "next/link";
import { EngineForm } from "@/components/admin/engine-form";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { listProfileOptions, listVesselOptions } from "@/lib/admin/queries";
import { requirePermission } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Add main engine" };

export default async function NewEnginePage({ searchParams }: { searchParams: Promise<{ vesselId?: string }> }) {
  await requirePermission("admin.fleet");
  const [{ vesselId }, vessels, profiles] = await Promise.all([searchParams, listVesselOptions(), listProfileOptions()]);
  const preset = vessels.find((v) => String(v.id) === vesselId)?.id;
  return (
    <>
      <PageHeader eyebrow={<Link href="/admin/engines" className="hover:underline">Main engines</Link>} title="Add main engine" />
      {profiles.length === 0 || vessels.length === 0 ? (
        <Card className="max-w-xl p-5 text-sm text-ink-soft">
          An engine needs a vessel and an engine profile. Add {vessels.length === 0 ? "a vessel" : "an engine profile"} first.
          <div className="mt-3">
            <Link href={vessels.length === 0 ? "/admin/vessels/new" : "/admin/profiles/new"} className={buttonClass("secondary")}>
              {vessels.length === 0 ? "Add vessel" : "Add engine profile"}
            </Link>
          </div>
        </Card>
      ) : (
        <EngineForm vessels={vessels} profiles={profiles} vesselId={preset} />
      )}
    </>
  );
}
