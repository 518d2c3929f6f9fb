/**
 * Kalibore's e-mails: plain words, a text part for every message and a small HTML part
 * with one link. No images, no tracking. Pure functions so they are easy to test.
 */
import { day, hours, hoursText, mm } from "@/lib/format";

export type MailContent = { subject: string; text: string; html: string };

const escapeHtml = (s: string) =>
  s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");

const FOOTER = "Kalibore — liner and ring wear records. You get this e-mail because of an account on this Kalibore installation.";

function layout(paragraphs: string[], action?: { label: string; url: string }): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 14px;white-space:pre-line">${escapeHtml(p)}</p>`).join("");
  const button = action
    ? `<p style="margin:20px 0"><a href="${escapeHtml(action.url)}" style="display:inline-block;background:#0a5c73;color:#ffffff;padding:10px 18px;border-radius:6px;text-decoration:none;font-weight:600">${escapeHtml(action.label)}</a></p>` +
      `<p style="margin:0 0 14px;font-size:13px;color:#3a4350">If the button does not work, copy this address into your browser:<br>${escapeHtml(action.url)}</p>`
    : "";
  return `<!doctype html><html lang="en-GB"><body style="margin:0;background:#f6f5f1">
<div style="max-width:560px;margin:0 auto;padding:24px;font-family:Helvetica,Arial,sans-serif;font-size:15px;line-height:1.5;color:#111720">
<p style="margin:0 0 20px;font-size:18px;font-weight:700;letter-spacing:.02em">Kali<span style="color:#0a5c73">bore</span></p>
${body}${button}
<p style="margin:24px 0 0;font-size:12px;color:#5f6875">${escapeHtml(FOOTER)}</p>
</div></body></html>`;
}

function text(paragraphs: string[], action?: { label: string; url: string }): string {
  const parts = [...paragraphs];
  if (action) parts.push(`${action.label}:\n${action.url}`);
  parts.push("--\n" + FOOTER);
  return parts.join("\n\n") + "\n";
}

function message(subject: string, paragraphs: string[], action?: { label: string; url: string }): MailContent {
  return { subject, text: text(paragraphs, action), html: layout(paragraphs, action) };
}

export function invitationEmail(o: {
  name: string;
  inviterName: string;
  roleLabel: string;
  vesselNames: string[];
  url: string;
  expiresOn: string;
}): MailContent {
  const vessels = o.vesselNames.length ? ` for ${o.vesselNames.join(", ")}` : "";
  return message(
    "Your Kalibore account is ready to set up",
    [
      `Hello ${o.name},`,
      `${o.inviterName} has invited you to Kalibore as ${o.roleLabel.toLowerCase()}${vessels}.`,
      `Open the link below to choose your password. The link works once and expires on ${o.expiresOn}.`,
    ],
    { label: "Set your password", url: o.url },
  );
}

export function passwordResetEmail(o: { name: string; url: string; validMinutes: number }): MailContent {
  return message(
    "Reset your Kalibore password",
    [
      `Hello ${o.name},`,
      `Someone asked to reset the password of your Kalibore account. If it was you, open the link below within ${o.validMinutes} minutes and choose a new password.`,
      "If it was not you, ignore this e-mail: your password stays as it is.",
    ],
    { label: "Choose a new password", url: o.url },
  );
}

export function invitationRequestEmail(o: { inviterName: string; inviteeName: string; inviteeEmail: string; reason: "expired" | "revoked"; url: string }): MailContent {
  const why = o.reason === "expired" ? "has expired" : "was withdrawn";
  return message(
    `${o.inviteeName} asks for a new Kalibore invitation`,
    [
      `Hello ${o.inviterName},`,
      `The invitation you sent to ${o.inviteeName} <${o.inviteeEmail}> ${why}, and they have asked for a new one.`,
      "If they should have access, open the users page and send the invitation again.",
    ],
    { label: "Open the users page", url: o.url },
  );
}

/*
 * Alerts and the digest. Each names the ship and the unit, gives the figures with their
 * dates, links to the page, and says where to switch the e-mail off.
 */

type Unit = { vesselName: string; cylinderNo: number };
type Recipient = { name: string; url: string; preferencesUrl: string };

const unitName = (u: Unit) => `${u.vesselName}, cylinder ${u.cylinderNo}`;
const preferencesLine = (url: string) => `You get this e-mail because of your Kalibore notification settings. To change them: ${url}`;

function alert(subject: string, r: Recipient, paragraphs: string[], label: string): MailContent {
  return message(subject, [`Hello ${r.name},`, ...paragraphs, preferencesLine(r.preferencesUrl)], { label, url: r.url });
}

const wearLine = (maxWearMm: number | null, limitMm: number | null) =>
  maxWearMm === null ? "No liner readings." : `Largest wear ${mm(maxWearMm)}${limitMm === null ? "" : ` (limit ${mm(limitMm)})`}.`;

export function inspectionSubmittedEmail(
  o: Recipient & Unit & { inspectedOn: string; engineHours: number; linerHours: number; submitterName: string; submittedOn: string; maxWearMm: number | null; wearLimitMm: number | null },
): MailContent {
  return alert(
    `Record to approve: ${unitName(o)}`,
    o,
    [
      `${o.submitterName} submitted the inspection of ${unitName(o)} on ${day(o.submittedOn)}. It waits for your check and approval.`,
      `Gauged on ${day(o.inspectedOn)} at ${hours(o.engineHours)} engine hours, ${hours(o.linerHours)} liner hours. ${wearLine(o.maxWearMm, o.wearLimitMm)}`,
    ],
    "Open the record",
  );
}

export function inspectionReturnedEmail(o: Recipient & Unit & { inspectedOn: string; returnerName: string; returnedOn: string; comment: string }): MailContent {
  return alert(
    `Record returned: ${unitName(o)}`,
    o,
    [
      `${o.returnerName} returned your inspection of ${unitName(o)}, gauged on ${day(o.inspectedOn)}, on ${day(o.returnedOn)}.`,
      `Comment: “${o.comment}”`,
      "Correct the record and submit it again.",
    ],
    "Open the record",
  );
}

export function overLimitEmail(
  o: Recipient & Unit & { inspectedOn: string; approverName: string; approvedOn: string; maxWearMm: number | null; wearLimitMm: number; maxOvalityMm: number | null; ovalityLimitMm: number; reasons: string[] },
): MailContent {
  const ovality = o.maxOvalityMm === null ? "" : ` Largest ovality ${mm(o.maxOvalityMm)} (limit ${mm(o.ovalityLimitMm)}).`;
  return alert(
    `Over limit: ${unitName(o)}`,
    o,
    [
      `${o.approverName} approved the inspection of ${unitName(o)}, gauged on ${day(o.inspectedOn)}, on ${day(o.approvedOn)}. It shows a value at or over its limit.`,
      `${wearLine(o.maxWearMm, o.wearLimitMm)}${ovality}`,
      ...(o.reasons.length ? [o.reasons.join(" ")] : []),
      "The engine maker's limits and manual govern what to do next.",
    ],
    "Open the unit",
  );
}

export function horizonEmail(
  o: Recipient & Unit & { linerSerial: string | null; limitOn: string; earliestOn: string; latestOn: string | null; horizonDays: number; maxWearMm: number | null; wearLimitMm: number | null; lastInspectedOn: string | null },
): MailContent {
  const range = o.latestOn ? ` (between ${day(o.earliestOn)} and ${day(o.latestOn)})` : ` (at the earliest ${day(o.earliestOn)})`;
  return alert(
    `Limit in sight: ${unitName(o)}`,
    o,
    [
      `The liner${o.linerSerial ? ` ${o.linerSerial}` : ""} of ${unitName(o)} is projected to reach its limit around ${day(o.limitOn)}${range}. The early date is within the company's alert horizon of ${o.horizonDays} days.`,
      `${wearLine(o.maxWearMm, o.wearLimitMm)} Last gauged on ${day(o.lastInspectedOn)}.`,
      "Plan the renewal and check that a spare liner can reach the ship in time.",
    ],
    "Open the unit",
  );
}

export function probabilityEmail(
  o: Recipient & Unit & { part: string; probability: number; threshold: number; nextOverhaulOn: string | null; nextOverhaulHours: number | null },
): MailContent {
  const when = o.nextOverhaulOn ? `the next overhaul, expected around ${day(o.nextOverhaulOn)}` : `the next overhaul at ${hoursText(o.nextOverhaulHours)} engine hours`;
  return alert(
    `Likely over limit by next overhaul: ${unitName(o)}`,
    o,
    [
      `The ${o.part} of ${unitName(o)} has a ${Math.round(o.probability * 100)} % chance of passing its limit by ${when}. The company's threshold is ${Math.round(o.threshold * 100)} %.`,
      "Consider renewing it at that overhaul.",
    ],
    "Open the unit",
  );
}

export function planMissedEmail(o: Recipient & Unit & { part: string; place: string | null; plannedOn: string }): MailContent {
  return alert(
    `Renewal not done: ${unitName(o)}`,
    o,
    [
      `The ${o.part} renewal of ${unitName(o)} was planned for ${day(o.plannedOn)}${o.place ? ` at ${o.place}` : ""}. That day has passed and no renewal is recorded (no approved inspection of a new ${o.part}).`,
      "Record the renewal if it was done, or plan it into another port call or docking.",
    ],
    "Open the unit",
  );
}

export function orderByEmail(
  o: Recipient & { profileName: string; part: string; short: number; firstShortOn: string; orderBy: string; leadTimeDays: number | null; vesselNames: string[] },
): MailContent {
  const late = o.orderBy < new Date().toISOString().slice(0, 10);
  return alert(
    `Order ${o.short} ${o.part}${o.short === 1 ? "" : "s"} by ${day(o.orderBy)}: ${o.profileName}`,
    o,
    [
      `The planned and projected renewals of ${o.profileName} engines (${o.vesselNames.join(", ")}) leave ${o.short} ${o.part}${o.short === 1 ? "" : "s"} short, the first on ${day(o.firstShortOn)}.`,
      `${o.leadTimeDays === null ? "" : `With a lead time of ${o.leadTimeDays} days, `}the order must be placed by ${day(o.orderBy)}${late ? " — that day has already passed" : ""}.`,
    ],
    "Open the spares outlook",
  );
}

export type DigestSection = { title: string; lines: string[] };

export function digestEmail(o: Recipient & { week: string; summary: string; sections: DigestSection[] }): MailContent {
  const paragraphs = [`Hello ${o.name},`, `Your Kalibore week ${o.week.replace("-W", ", week ")}:`];
  for (const s of o.sections) paragraphs.push(`${s.title}\n${s.lines.map((l) => `• ${l}`).join("\n")}`);
  paragraphs.push(preferencesLine(o.preferencesUrl));
  return message(`Your Kalibore week: ${o.summary}`.slice(0, 200), paragraphs, { label: "Open Kalibore", url: o.url });
}
