import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { expect, test, type Page } from "@playwright/test";
import { simpleParser } from "mailparser";
import { DEMO, DEMO_PASSWORD } from "./helpers";

const MAIL_DIR = path.resolve(process.env.MAIL_FAKE_DIR ?? ".data/mail");

/**
 * Signs in through the form. The sign-in rate limit is on in these tests too (as in
 * production), so when the form says "Too many attempts" this waits the window out once.
 */
async function signInPatiently(page: Page, email: string, password = DEMO_PASSWORD) {
  for (let attempt = 0; attempt < 2; attempt++) {
    await page.goto("/sign-in");
    await page.getByLabel("E-mail").fill(email);
    await page.getByLabel("Password").fill(password);
    await page.getByRole("button", { name: "Sign in" }).click();
    const outcome = await Promise.race([
      page.waitForURL((u) => !u.pathname.startsWith("/sign-in"), { timeout: 15_000 }).then(() => "in" as const),
      page.getByText("Too many attempts").waitFor({ timeout: 15_000 }).then(() => "limited" as const),
    ]);
    if (outcome === "in") return;
    await page.waitForTimeout(61_000);
  }
  throw new Error(`could not sign in as ${email}`);
}

/** The newest captured e-mail to `to`, parsed. */
async function newestMailTo(to: string) {
  for (let i = 0; i < 50; i++) {
    const files = readdirSync(MAIL_DIR).filter((f) => f.endsWith(".eml")).sort().reverse();
    for (const f of files.slice(0, 30)) {
      const mail = await simpleParser(readFileSync(path.join(MAIL_DIR, f)));
      const addresses = [mail.to].flat().flatMap((a) => a?.value ?? []).map((v) => v.address?.toLowerCase());
      if (addresses.includes(to.toLowerCase())) return mail;
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`no e-mail to ${to} in ${MAIL_DIR}`);
}

test.describe("[ROLES][HOME] each role lands on its own start", () => {
  test.describe.configure({ timeout: 180_000 });

  test("[ADMIN] lands on the admin overview", async ({ page }) => {
    await signInPatiently(page, DEMO.admin);
    await expect(page).toHaveURL(/\/admin$/);
    await expect(page.getByRole("heading", { name: "People, vessels and engines" })).toBeVisible();
    await expect(page.getByRole("link", { name: "Invite a person" })).toBeVisible();
  });

  test("[SUPERINTENDENT] lands on the fleet", async ({ page }) => {
    await signInPatiently(page, DEMO.superintendent);
    await expect(page).toHaveURL(/\/fleet$/);
    await expect(page.getByRole("heading", { name: "Fleet", level: 1 })).toBeVisible();
    // The admin area is not offered, and refused if typed in.
    await expect(page.getByRole("link", { name: "Admin" })).toHaveCount(0);
    await page.goto("/admin/users");
    await expect(page).toHaveURL(/\/no-access/);
  });

  test("[CHIEF] lands on the approval list and the engine", async ({ page }) => {
    await signInPatiently(page, DEMO.chief);
    await expect(page).toHaveURL(/\/$/);
    await expect(page.getByRole("heading", { name: /Awaiting your approval/ })).toBeVisible();
    await expect(page.getByRole("heading", { name: /Main engine/ })).toBeVisible();
  });

  test("[ENGINEER] lands on their engine and drafts, without approval", async ({ page }) => {
    await signInPatiently(page, DEMO.engineer);
    await expect(page).toHaveURL(/\/$/);
    await expect(page.getByRole("heading", { name: /Your drafts/ })).toBeVisible();
    await expect(page.getByRole("heading", { name: /Main engine/ })).toBeVisible();
    await expect(page.getByRole("heading", { name: /Awaiting your approval/ })).toHaveCount(0);
    await expect(page.locator("main").getByText(/^Cyl\. \d+$/).first()).toBeVisible();
    // A unit that is not theirs (or not there) and an address that is no page both get our own
    // plain page with a way back, not the framework's bare 404.
    await page.goto("/units/99999");
    await expect(page.getByRole("heading", { name: "Nothing here" })).toBeVisible();
    await expect(page.getByRole("link", { name: "Back to start" })).toBeVisible();
    await page.goto("/no-such-page");
    await expect(page.getByRole("heading", { name: "No such page" })).toBeVisible();
  });
});

test.describe("[AUTH] sign-in and invitations", () => {
  test.describe.configure({ timeout: 180_000 });

  test("[SIGN_IN] a wrong password shows one generic message", async ({ page }) => {
    await page.goto("/sign-in");
    await page.getByLabel("E-mail").fill(DEMO.engineer);
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in" }).click();
    await expect(page.getByText(/The e-mail address or password is not right\.|Too many attempts/)).toBeVisible();
    await expect(page).toHaveURL(/\/sign-in/);
  });

  test("[ADMIN][INVITE] an invitation e-mail leads to a working account", async ({ page, browser, baseURL }) => {
    const email = `new.engineer.${Date.now()}@brisemer.example`;
    await signInPatiently(page, DEMO.admin);
    await page.goto("/admin/users/invite");
    await page.getByLabel("Full name").fill("Noor Newcomer");
    await page.getByLabel("E-mail address").fill(email);
    await page.getByLabel("Role").selectOption("engineer");
    await page.locator('input[name="vesselIds"]').first().check();
    await page.getByRole("button", { name: "Send invitation" }).click();
    await expect(page.getByText(`Invitation sent to ${email}.`)).toBeVisible();

    const mail = await newestMailTo(email);
    expect(mail.subject).toContain("Kalibore");
    expect(mail.text).toContain("/invite/");
    const link = new URL(/https?:\/\/\S+\/invite\/[A-Za-z0-9_-]+/.exec(mail.text ?? "")![0]);

    // A fresh browser: the invitee is not the admin.
    const context = await browser.newContext();
    const invitee = await context.newPage();
    await invitee.goto(new URL(link.pathname, baseURL).href);
    await expect(invitee.getByRole("heading", { name: "Welcome, Noor Newcomer" })).toBeVisible();
    await invitee.getByLabel("New password").fill("Scavenge-port-47");
    await invitee.getByLabel("Type it again").fill("Scavenge-port-46");
    await invitee.getByRole("button", { name: "Set password and sign in" }).click();
    await expect(invitee.getByText("The two passwords differ.")).toBeVisible();
    await expect(invitee.getByLabel("New password")).toHaveValue("Scavenge-port-47");
    await invitee.getByLabel("Type it again").fill("Scavenge-port-47");
    await invitee.getByRole("button", { name: "Set password and sign in" }).click();
    await expect(invitee).toHaveURL(/\/$/);
    await expect(invitee.getByRole("heading", { name: "Hello, Noor" })).toBeVisible();

    // The link works once.
    await invitee.goto(new URL(link.pathname, baseURL).href);
    await expect(invitee.getByRole("heading", { name: "Invitation already used" })).toBeVisible();
    await context.close();
  });
});
