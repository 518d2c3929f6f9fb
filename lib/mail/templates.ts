/**
 * Kalibore's e-mails: plain words, a text part for every message and a small HTML part
 * with one link. No images, no tracking. Pure functions so they are easy to test.
 */
export type MailContent = { subject: string; text: string; html: string };

const escapeHtml = (s: string) =>
  s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");

const FOOTER = "Kalibore — liner and ring wear records. You get this e-mail because of an account on this Kalibore installation.";

function layout(paragraphs: string[], action?: { label: string; url: string }): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 14px">${escapeHtml(p)}</p>`).join("");
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
