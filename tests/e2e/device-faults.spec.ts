import { expect, test, type Page, type Route } from "@playwright/test";
import sharp from "sharp";
import { discardDraft, openNewSheet, signIn } from "./helpers";

/*
 * The device's side of a server fault: while the database is down the API answers 503, and
 * while the object store is down a photo's upload fails. The tablet keeps the entries and the
 * photo, says so, and sends them by itself once the services are back. (The services' own side
 * — nothing half-written, 503 in words — is tests/integration/faults.test.ts.)
 */

const ENGINEER2 = "engineer2@brisemer.example";
const status = (page: Page) => page.locator("[data-save-status]");

async function openSheet(page: Page, cylinder: RegExp) {
  const { inspectionId, boreMm } = await openNewSheet(page, cylinder);
  // Readings a little above the bore, inside any plausibility band (no warning to confirm).
  return { inspectionId, value: (i: number) => (boreMm + 0.25 + i * 0.01).toFixed(2) };
}

test.describe("[ENGINEER][INSPECTION] the server's services fail while the sheet is open", () => {
  test("database down, then store down: the entries and the photo wait on the tablet and are sent when the services are back", async ({ page }) => {
    test.setTimeout(150_000);
    await signIn(page, ENGINEER2);
    const { inspectionId, value } = await openSheet(page, /Cylinder 3\b/);
    const url = new RegExp(`/api/inspections/${inspectionId}$`);
    let refused = 0;
    const dbDown = async (route: Route) => {
      if (route.request().method() !== "PUT") return route.fallback();
      refused += 1;
      await route.fulfill({
        status: 503,
        headers: { "retry-after": "10" },
        json: { error: "The database cannot be reached just now; nothing was saved or changed." },
      });
    };
    await page.route(url, dbDown);
    await page.locator("#cell-0-0").fill(value(0));
    await expect.poll(() => refused, { timeout: 15_000 }).toBeGreaterThan(0);
    await expect(status(page)).toHaveAttribute("data-save-status", "offline");
    const kept = await page.evaluate((id) => localStorage.getItem(`kalibore:inspection:${id}`), inspectionId);
    expect(kept).toContain(value(0));

    await page.unroute(url, dbDown);
    // The sheet also tries again every few seconds by itself; the browser's "online" makes it try at once.
    await page.evaluate(() => window.dispatchEvent(new Event("online")));
    await expect(status(page)).toHaveAttribute("data-save-status", "saved", { timeout: 30_000 });
    await page.reload();
    await expect(page.locator("#cell-0-0")).toHaveValue(value(0));

    // The object store goes down during a photo upload (same sheet).
    await expect(status(page)).toHaveAttribute("data-save-status", "saved");
    const toStore = (u: URL) => u.port === String(process.env.S3_FAKE_PORT ?? 4579);
    const storeDown = (route: Route) => route.abort("connectionrefused");
    await page.route(toStore, storeDown);
    const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 96, g: 104, b: 112 } } }).png().toBuffer();
    await page.locator("#photo-caption").fill("Scavenge port, fore side");
    await page.locator("#photo-file").setInputFiles({ name: "port.png", mimeType: "image/png", buffer: png });
    await expect(page.getByTestId("photos-waiting")).toContainText("1 photo waiting", { timeout: 15_000 });

    await page.unroute(toStore, storeDown);
    await page.evaluate(() => window.dispatchEvent(new Event("online")));
    await expect(page.getByText("now stored")).toBeVisible({ timeout: 45_000 });
    await expect(page.getByTestId("photos-waiting")).toHaveCount(0);
    await expect(page.locator("#photos img").first()).toBeVisible();
    await discardDraft(page, inspectionId);
  });
});
