import { expect, test, type Browser, type Page } from "@playwright/test";
import { DEMO, signIn } from "./helpers";

/*
 * The wear screens (fleet, unit history, inspection record) at a phone's, a tablet's and a
 * desk's width: nothing scrolls sideways, the unit history shows its stored analysis (next
 * overhaul, trend, profile, rings, overhauls) and every figure in the one number style.
 */

const SIZES = [
  { name: "phone", width: 390, height: 844, touch: true },
  { name: "tablet", width: 820, height: 1180, touch: true },
  { name: "desk", width: 1440, height: 900, touch: false },
] as const;

async function noSidewaysScroll(page: Page, what: string) {
  const { scroll, client } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, client: document.documentElement.clientWidth }));
  expect(scroll, `${what} scrolls sideways`).toBeLessThanOrEqual(client);
}

async function signedIn(browser: Browser, size: (typeof SIZES)[number]) {
  const context = await browser.newContext({ viewport: { width: size.width, height: size.height }, hasTouch: size.touch, isMobile: size.touch && size.width < 500 });
  const page = await context.newPage();
  await signIn(page, DEMO.superintendent);
  return { context, page };
}

test.describe("wear screens", () => {
  test.describe.configure({ timeout: 180_000 });

  for (const size of SIZES) {
    test(`fleet, unit history and inspection record at ${size.width} px`, async ({ browser }) => {
      const { context, page } = await signedIn(browser, size);
      await page.goto("/fleet");
      await expect(page.getByTestId("fleet-rate-spread")).toContainText("median");
      await noSidewaysScroll(page, "fleet");
      await page.screenshot({ path: `.test-data/screens/wear-fleet-${size.name}.png`, fullPage: true });

      await page.getByRole("link", { name: "All units at a glance →" }).first().click();
      await page.locator('a[href^="/units/"]:visible').first().click();
      await expect(page.getByRole("heading", { level: 1 })).toContainText("Cylinder");
      await expect(page.getByText("Next overhaul")).toBeVisible();
      await expect(page.getByTestId("unit-overhauls")).toBeVisible();
      // One number style: hours grouped with a comma, never a thin space; no "-0.00".
      const text = await page.locator("main").innerText();
      expect(text).not.toMatch(/\d[\u2009\u202f]\d{3}/);
      expect(text).not.toMatch(/-0\.00\b/);
      await page.waitForTimeout(300); // the charts size themselves to their box
      await noSidewaysScroll(page, "unit history");
      await page.screenshot({ path: `.test-data/screens/wear-unit-${size.name}.png`, fullPage: true });

      await page.getByTestId("unit-overhauls").locator('a[href^="/inspections/"]').first().click();
      await expect(page.getByTestId("inspection-rings")).toBeVisible();
      await noSidewaysScroll(page, "inspection record");
      await page.screenshot({ path: `.test-data/screens/wear-inspection-${size.name}.png`, fullPage: true });
      await context.close();
    });
  }
});
