import { approvalRefusal } from "@/lib/inspections/approval";
import type { Role } from "@/lib/auth/roles";
import { BAND_LABELS, type BandKey } from "@/lib/wear/bands";
import { day, mm } from "@/lib/format";
import type { DigestSection } from "@/lib/mail/templates";

/*
 * What one person's weekly digest says, from the week's facts about the fleet: pure, so the
 * choice of what each person hears is tested without a database. Only their vessels; a person
 * with nothing to hear gets no digest that week.
 */

export type DigestRecord = {
  id: number;
  vesselId: number;
  vesselName: string;
  cylinderNo: number;
  inspectedOn: string;
  state: "submitted" | "returned";
  createdBy: string | null;
  submittedBy: string | null;
  byName: string | null;
};
export type DigestBandMove = { unitId: number; vesselId: number; vesselName: string; cylinderNo: number; from: string; to: string };
export type DigestLimit = { unitId: number; vesselId: number; vesselName: string; cylinderNo: number; limitOn: string; earliestOn: string; maxWearMm: number | null };
/** A renewal coming up, or a spare short of what the plans need. */
export type DigestPlanLine = { vesselId: number; text: string };

export type DigestFacts = {
  records: DigestRecord[];
  bandMoves: DigestBandMove[];
  limits: DigestLimit[];
  renewals: DigestPlanLine[];
  shortfalls: DigestPlanLine[];
};

export type DigestPerson = { id: string; role: Role; vesselIds: number[] };

const bandName = (b: string) => BAND_LABELS[b as BandKey] ?? b;
const MAX_LINES = 12;

function section(title: string, lines: string[]): DigestSection[] {
  if (!lines.length) return [];
  const shown = lines.slice(0, MAX_LINES);
  if (lines.length > shown.length) shown.push(`and ${lines.length - shown.length} more in Kalibore`);
  return [{ title, lines: shown }];
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** The person's digest sections and a one-line summary for the subject, or null when there is nothing to say. */
export function composeDigest(person: DigestPerson, facts: DigestFacts): { summary: string; sections: DigestSection[] } | null {
  const mine = (v: { vesselId: number }) => person.vesselIds.includes(v.vesselId);
  const unit = (r: { vesselName: string; cylinderNo: number }) => `${r.vesselName}, cylinder ${r.cylinderNo}`;
  const records = facts.records.filter(mine);
  const toApprove = records.filter(
    (r) => r.state === "submitted" && approvalRefusal({ id: person.id, role: person.role }, { createdBy: r.createdBy, submittedBy: r.submittedBy }) === null,
  );
  const ownWaiting = records.filter((r) => r.state === "submitted" && (r.createdBy === person.id || r.submittedBy === person.id));
  const returned = records.filter((r) => r.state === "returned" && r.createdBy === person.id);
  const moves = facts.bandMoves.filter(mine);
  const limits = facts.limits.filter(mine);
  const renewals = facts.renewals.filter(mine);
  const shortfalls = facts.shortfalls.filter(mine);

  const sections = [
    ...section(
      "Records waiting for your approval:",
      toApprove.map((r) => `${unit(r)}, gauged ${day(r.inspectedOn)}${r.byName ? `, submitted by ${r.byName}` : ""}`),
    ),
    ...section(
      "Your records returned for correction:",
      returned.map((r) => `${unit(r)}, gauged ${day(r.inspectedOn)}`),
    ),
    ...section(
      "Your records waiting for someone else's approval:",
      ownWaiting.map((r) => `${unit(r)}, gauged ${day(r.inspectedOn)}`),
    ),
    ...section(
      "Units that moved band this week:",
      moves.map((m) => `${unit(m)}: ${bandName(m.from)} → ${bandName(m.to)}`),
    ),
    ...section(
      "Limits coming inside the alert horizon:",
      limits.map((l) => `${unit(l)}: limit around ${day(l.limitOn)}, at the earliest ${day(l.earliestOn)}${l.maxWearMm === null ? "" : ` (wear now ${mm(l.maxWearMm)})`}`),
    ),
    ...section("Renewals coming up:", renewals.map((r) => r.text)),
    ...section("Spares short:", shortfalls.map((r) => r.text)),
  ];
  if (!sections.length) return null;
  const parts = [
    toApprove.length ? plural(toApprove.length, "record to approve", "records to approve") : null,
    returned.length ? plural(returned.length, "record returned", "records returned") : null,
    moves.length ? plural(moves.length, "unit moved band", "units moved band") : null,
    limits.length ? plural(limits.length, "limit in sight", "limits in sight") : null,
    renewals.length ? plural(renewals.length, "renewal coming", "renewals coming") : null,
    shortfalls.length ? plural(shortfalls.length, "spare short", "spares short") : null,
  ].filter((p): p is string => p !== null);
  return { summary: parts.length ? parts.join(", ") : "your records", sections };
}
