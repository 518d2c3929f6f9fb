import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { DEMO, signIn } from "./helpers";

/*
 * The main screens against WCAG 2.1 levels A and AA (W3C Recommendation), as checked by
 * axe-core, Deque's open-source rules engine: contrast that survives a dim engine room,
 * names on every control, tables and landmarks a screen reader can follow. Each screen is
 * checked at desk width and at a phone's, since the phone layouts fold columns differently.
 */

const WCAG_TAGS = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"];

async function expectNoViolations(page: Page, what: string) {
  // After an in-app link the title arrives with the streamed page: check once it is there.
  await expect(page).toHaveTitle(/Kalibore/);
  await page.waitForLoadState("networkidle");
  // Phone first, so the page is left at desk width for the steps that follow.
  for (const viewport of [
    { width: 390, height: 844 },
    { width: 1280, height: 900 },
  ]) {
    await page.setViewportSize(viewport);
    const result = await new AxeBuilder({ page }).withTags(WCAG_TAGS).analyze();
    const found = result.violations.map((v) => `${v.id} (${v.impact}) on ${v.nodes.map((n) => n.target.join(" ")).slice(0, 3).join(", ")}: ${v.help}`);
    expect(found, `${what} at ${viewport.width} px`).toEqual([]);
  }
}

test.describe("[A11Y] WCAG 2.1 AA on the main screens (axe-core)", () => {
  test.describe.configure({ timeout: 180_000 });

  test("sign-in", async ({ page }) => {
    await page.goto("/sign-in");
    await expectNoViolations(page, "sign-in");
  });

  test("the chief engineer's screens: home, fleet, vessel, engine, unit, inspection", async ({ page }) => {
    await signIn(page, DEMO.chief);
    await expectNoViolations(page, "chief's home");
    await page.goto("/fleet");
    await expectNoViolations(page, "fleet");
    await page.locator("main h2 a").first().click();
    await expect(page).toHaveURL(/\/vessels\/\d+$/);
    await expectNoViolations(page, "vessel");
    await page.getByRole("link", { name: "Units and wear →" }).first().click();
    await expect(page).toHaveURL(/\/engines\/\d+$/);
    await expectNoViolations(page, "engine");
    await page.getByRole("link", { name: /^Cyl\. 1$/ }).first().click();
    await expect(page).toHaveURL(/\/units\/\d+$/);
    await expectNoViolations(page, "unit history");
    await page.locator('main table a[href^="/inspections/"]').first().click();
    await expect(page).toHaveURL(/\/inspections\/\d+$/);
    await expectNoViolations(page, "inspection record");
  });

  test("the engineer's screens: home, unit chooser, new inspection, gauging sheet", async ({ page }) => {
    await signIn(page, "engineer2@brisemer.example");
    await expectNoViolations(page, "engineer's home");
    const draft = await page.locator('section[aria-labelledby="drafts"] a[href^="/inspections/"]').first().getAttribute("href");
    await page.goto("/inspections/new");
    await expectNoViolations(page, "unit chooser");
    await page.locator('main a[href*="unit="]').first().click();
    await expect(page).toHaveURL(/unit=\d+/);
    await expectNoViolations(page, "new inspection");
    expect(draft, "the demo gives engineer2 an open draft").toMatch(/^\/inspections\/\d+$/);
    await page.goto(`${draft}/edit`);
    await expect(page.locator("#cell-0-0")).toBeVisible();
    await expectNoViolations(page, "gauging sheet");
  });

  test("the administrator's screens: overview, users, invite, vessels, engines, profiles", async ({ page }) => {
    await signIn(page, DEMO.admin);
    for (const path of ["/admin", "/admin/users", "/admin/users/invite", "/admin/vessels", "/admin/engines", "/admin/profiles"]) {
      await page.goto(path);
      await expectNoViolations(page, path);
    }
    await page.locator('main a[href^="/admin/profiles/"]:not([href$="/new"])').first().click();
    await expect(page).toHaveURL(/\/admin\/profiles\/\d+/);
    await expectNoViolations(page, "profile editor");
  });
});
