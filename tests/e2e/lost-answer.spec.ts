import { expect, test, type Page, type Route } from "@playwright/test";
import { DEMO, discardDraft, openNewSheet, signIn } from "./helpers";

/*
 * A lost answer: the draft reaches the server and is saved, but the network drops before
 * the tablet hears back. The tablet keeps typing; when the network is back its next save
 * carries the revision it last heard of, which the server has already moved past — by the
 * tablet's own save. The tablet must recognise its own save and show "saved", never a
 * conflict with itself; and the server must end up with everything typed.
 */

const status = (page: Page) => page.locator("[data-save-status]");

/** The diameters the server holds for the first direction, as the sheet shows them (2 decimals). */
async function onServer(page: Page, inspectionId: number): Promise<string[]> {
  const dto = (await (await page.request.get(`/api/inspections/${inspectionId}`)).json()) as { draft: { readings: { diameterMm: number }[] } };
  return dto.draft.readings.map((r) => r.diameterMm.toFixed(2)).sort();
}

async function openSheet(page: Page, cylinder: RegExp) {
  const { inspectionId, boreMm } = await openNewSheet(page, cylinder);
  // Readings a little above the bore, inside any plausibility band (no warning to confirm).
  return { inspectionId, value: (i: number) => (boreMm + 0.3 + i * 0.01).toFixed(2) };
}

/** The next draft save reaches the server and is saved there; its answer never reaches the page. */
async function loseNextAnswer(page: Page, inspectionId: number): Promise<() => boolean> {
  let lost = false;
  const url = new RegExp(`/api/inspections/${inspectionId}$`);
  const handler = async (route: Route) => {
    if (route.request().method() !== "PUT" || lost) return route.fallback();
    const res = await route.fetch();
    expect(res.status(), await res.text()).toBe(200);
    lost = true;
    await route.abort("connectionreset");
    await page.unroute(url, handler);
  };
  await page.route(url, handler);
  return () => lost;
}

test.describe("[ENGINEER][INSPECTION] a save whose answer was lost", () => {
  test("typing goes on after a lost answer: the next save recognises the tablet's own save and shows saved", async ({ page }) => {
    test.setTimeout(120_000);
    await signIn(page, DEMO.engineer);
    const { inspectionId, value } = await openSheet(page, /Cylinder 4\b/);
    await page.locator("#cell-0-0").fill(value(0));
    await expect(status(page)).toHaveAttribute("data-save-status", "saved", { timeout: 15_000 });

    const lost = await loseNextAnswer(page, inspectionId);
    await page.locator("#cell-1-0").fill(value(1));
    await expect.poll(lost, { timeout: 15_000 }).toBe(true);
    await expect(status(page)).toHaveAttribute("data-save-status", "offline", { timeout: 15_000 });

    // The network is back; the engineer types on.
    await page.locator("#cell-2-0").fill(value(2));
    await expect(status(page)).toHaveAttribute("data-save-status", "saved", { timeout: 30_000 });
    await expect(page.getByText("Not saved: changed elsewhere")).toHaveCount(0);

    // The server holds all three readings.
    await expect.poll(() => onServer(page, inspectionId), { timeout: 15_000 }).toEqual([value(0), value(1), value(2)]);
    await discardDraft(page, inspectionId);
  });

  test("a lost answer, more typing with no network, then the sheet is opened again: saved, no conflict", async ({ page, context }) => {
    test.setTimeout(120_000);
    await signIn(page, DEMO.engineer);
    const { inspectionId, value } = await openSheet(page, /Cylinder 2\b/);
    await page.locator("#cell-0-0").fill(value(0));
    await expect(status(page)).toHaveAttribute("data-save-status", "saved", { timeout: 15_000 });

    const lost = await loseNextAnswer(page, inspectionId);
    await page.locator("#cell-1-0").fill(value(1));
    await expect.poll(lost, { timeout: 15_000 }).toBe(true);
    await context.setOffline(true);
    await page.locator("#cell-2-0").fill(value(2));
    await expect(status(page)).toHaveAttribute("data-save-status", "offline", { timeout: 15_000 });

    // The tab is closed; later, back in the control room with the network, the sheet is opened again.
    const sheetUrl = page.url();
    await page.close();
    await context.setOffline(false);
    const again = await context.newPage();
    await again.goto(sheetUrl);
    // The reading typed with no network reaches the server, with no conflict on the way.
    await expect.poll(() => onServer(again, inspectionId), { timeout: 30_000 }).toEqual([value(0), value(1), value(2)]);
    await expect(status(again)).toHaveAttribute("data-save-status", "saved");
    await expect(again.getByText("Not saved: changed elsewhere")).toHaveCount(0);
    await discardDraft(again, inspectionId);
  });
});
