import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { EngineUnits } from "@/components/home/engine-units";
import { InspectionList } from "@/components/home/inspection-list";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { can } from "@/lib/auth/permissions";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { requireUser } from "@/lib/auth/session";
import { listAwaitingApproval, listAwaitingSomeoneElse, listEnginesWithUnits, listMyDrafts } from "@/lib/home/queries";

export const metadata: Metadata = { title: "Home" };

/**
 * Each role starts where its work is: the office roles go straight to their screens;
 * the ship roles see their engine and their open records here.
 */
export default async function HomePage() {
  const user = await requireUser();
  if (user.role === "admin") redirect("/admin");
  if (user.role === "superintendent") redirect("/fleet");

  const isChief = can(user.role, "inspection.approve");
  const [engines, drafts, awaiting, ownSubmitted] = await Promise.all([
    listEnginesWithUnits(user),
    listMyDrafts(user),
    isChief ? listAwaitingApproval(user) : Promise.resolve([]),
    isChief ? listAwaitingSomeoneElse(user) : Promise.resolve([]),
  ]);

  const noVessel = user.vessels !== "all" && user.vessels.length === 0;
  return (
    <>
      <PageHeader eyebrow={ROLE_LABELS[user.role]} title={`Hello, ${user.name.split(" ")[0]}`}>
        {can(user.role, "inspection.create") && !noVessel ? (
          <Link href="/inspections/new" className={buttonClass("primary", "lg")}>New inspection</Link>
        ) : null}
      </PageHeader>
      {noVessel ? (
        <Card className="p-5 text-ink-soft">No vessel is assigned to you yet. Ask your administrator to add you to your ship.</Card>
      ) : (
        <div className="space-y-8">
          {isChief ? (
            <section aria-labelledby="awaiting">
              <h2 id="awaiting" className="mb-3 text-lg font-semibold">
                Awaiting your approval <span className="num text-ink-faint">({awaiting.length})</span>
              </h2>
              <InspectionList rows={awaiting} showBy empty="Nothing waiting: every submitted record has been approved or returned." />
            </section>
          ) : null}
          {isChief && ownSubmitted.length ? (
            <section aria-labelledby="own-submitted">
              <h2 id="own-submitted" className="mb-1 text-lg font-semibold">
                Waiting for another approver <span className="num text-ink-faint">({ownSubmitted.length})</span>
              </h2>
              <p className="mb-3 text-sm text-ink-soft">
                You entered or submitted these yourself, so someone else checks them: another chief engineer of the vessel or the superintendent.
              </p>
              <InspectionList rows={ownSubmitted} showBy empty="" />
            </section>
          ) : null}
          <section aria-labelledby="drafts">
            <h2 id="drafts" className="mb-3 text-lg font-semibold">
              Your drafts <span className="num text-ink-faint">({drafts.length})</span>
            </h2>
            <InspectionList rows={drafts} empty="No drafts open. Start a new inspection when a unit is overhauled." />
          </section>
          <section aria-labelledby="engine">
            <h2 id="engine" className="mb-3 text-lg font-semibold">{engines.length > 1 ? "Main engines" : "Main engine"}</h2>
            {engines.length === 0 ? (
              <Card className="p-4 text-sm text-ink-soft">No main engine is recorded for your vessel yet.</Card>
            ) : (
              <div className="space-y-4">
                {engines.map((e) => (
                  <EngineUnits key={e.engineId} engine={e} />
                ))}
              </div>
            )}
          </section>
        </div>
      )}
    </>
  );
}
