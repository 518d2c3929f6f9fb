import { expect, test, type Page } from "@playwright/test";
import { DEMO, shot, signIn } from "./helpers";

/** Opens one unit of the demo fleet the way a superintendent would: fleet → vessel → engine → cylinder. */
async function openUnit(page: Page, vessel: string, cylinder: number) {
  await page.goto("/fleet");
  await page.locator("main h2 a", { hasText: vessel }).click();
  await page.getByRole("link", { name: "Units and wear →" }).first().click();
  await page.getByRole("link", { name: new RegExp(`^Cyl\\. ${cylinder}$`) }).first().click();
  await expect(page.getByRole("heading", { name: `Cylinder ${cylinder}` })).toBeVisible();
}

async function noSidewaysScroll(page: Page) {
  const { scroll, client } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, client: document.documentElement.clientWidth }));
  expect(scroll).toBeLessThanOrEqual(client);
}

test.describe("[SUPERINTENDENT][DEMO] the demo's designed units read as designed", () => {
  test("the unit whose liner was renewed lists both liners, the old one with its reason, at every width", async ({ page }) => {
    test.setTimeout(150_000); // three full-page screenshots of a long page
    await signIn(page, DEMO.superintendent);
    await openUnit(page, "Brisemer Tern", 2);
    const liners = page.locator("h2", { hasText: "Liners in this unit" }).locator("xpath=following-sibling::ul/li");
    await expect(liners).toHaveCount(2);
    await expect(liners.nth(1)).toContainText(/removed .* Scuffing/);
    for (const [width, height] of [[390, 844], [820, 1180], [1440, 900]] as const) {
      await page.setViewportSize({ width, height });
      // At once, before the charts have heard of the new width, and again once settled.
      await noSidewaysScroll(page);
      await expect(page.getByRole("heading", { name: "Wear trend" })).toBeVisible();
      await noSidewaysScroll(page);
      await shot(page, `demo-renewed-unit-${width}`);
    }
  });

  test("the unit whose wear jumped after a lubrication fault says its last interval ran abnormally fast", async ({ page }) => {
    await signIn(page, DEMO.superintendent);
    await page.setViewportSize({ width: 1440, height: 900 });
    await openUnit(page, "Brisemer Fulmar", 3);
    // 0.1 mm/1000 h taken as abnormal: marineengineeringonline.com [src]
    await expect(page.getByText(/Wear over the last interval ran at 0\.1\d* mm\/1000 h, above the .* usually taken as abnormal/)).toBeVisible();
    await noSidewaysScroll(page);
    await shot(page, "demo-lubrication-unit-1440");
  });
});
