import { expect, test, type Page } from "@playwright/test";
import sharp from "sharp";
import { DEMO, shot, signIn } from "./helpers";

/*
 * The overhaul record end to end, at a tablet's size: the engineer opens an inspection,
 * types the whole liner grid (Enter moves down the column), loses the network halfway
 * and keeps typing (in inches for a while), gets it back, fills rings and checklist,
 * attaches a photo and submits; the chief engineer approves; the unit's page shows it.
 */

type Analysis = {
  context: { engineId: number };
  profile: { boreMm: number; stations: { key: string }[]; axes: { key: string; label: string }[]; rings: { position: number; gapNewMinMm: number; gapNewMaxMm: number; grooveNewMinMm: number; grooveNewMaxMm: number }[] };
  latest: { cells: { stationKey: string; axisKey: string; correctedMm: number }[] } | null;
};

const status = (page: Page) => page.locator("[data-save-status]");

/**
 * Chooses a cylinder on the new-inspection page, as the engineer would, and fills the header
 * with today's counter from the log and 20 °C temperatures. Returns the unit's analysis (last
 * time's readings) and a reading `step` mm above last time's at a cell.
 */
async function startInspection(page: Page, cylinder: string, crew: string, step: number) {
  await page.goto("/inspections/new");
  await expect(page.getByRole("heading", { name: "New inspection" })).toBeVisible();
  await page.getByRole("link", { name: new RegExp(cylinder) }).first().click();
  await expect(page).toHaveURL(/unit=\d+/);
  const unitId = Number(new URL(page.url()).searchParams.get("unit"));
  const analysis = (await (await page.request.get(`/api/units/${unitId}/analysis`)).json()) as Analysis;
  const engine = await (await page.request.get(`/api/engines/${analysis.context.engineId}/analysis`)).json();
  const last = analysis.latest?.cells ?? [];
  const value = (stationKey: string, axisKey: string) => {
    const prev = last.find((c) => c.stationKey === stationKey && c.axisKey === axisKey)?.correctedMm ?? analysis.profile.boreMm + 0.2;
    return Math.round((prev + step) * 100) / 100;
  };
  await page.getByLabel("Engine running hours (counter)").fill(String(Math.round(engine.latestHours.engineHours)));
  await page.getByLabel("Crew (who gauged)").fill(crew);
  await page.getByLabel("Micrometer temperature").fill("20");
  await page.getByLabel("Liner temperature").fill("20");
  return { unitId, analysis, value };
}

test.describe("[ENGINEER][CHIEF][INSPECTION] record, approve and see an overhaul", () => {
  test("an engineer records a full inspection through an offline spell; the chief approves it @tablet", async ({ page, browser, context }, info) => {
    test.setTimeout(300_000);
    const project = info.project.name;
    await signIn(page, DEMO.engineer);

    // What the record should look like: last time's readings plus 0.03 mm, today's counter from the log.
    const { unitId, analysis, value } = await startInspection(page, "Cylinder 3", "3/E and fitter", 0.03);
    const { stations, axes, rings } = analysis.profile;
    await expect(page.getByText(/Agrees with the running-hours log/)).toBeVisible();
    await shot(page, `inspection-new-${project}`);
    await page.getByRole("button", { name: "Open the gauging sheet" }).click();
    await expect(page).toHaveURL(/\/inspections\/\d+\/edit$/);
    const inspectionId = Number(page.url().match(/inspections\/(\d+)\/edit/)![1]);

    // First direction in mm, typed down the column with Enter.
    await page.locator("#cell-0-0").click();
    for (const s of stations) {
      await page.keyboard.type(value(s.key, axes[0].key).toFixed(2));
      await page.keyboard.press("Enter");
    }
    // Enter after the last station of the first column lands on the first station of the second.
    await expect(page.locator("#cell-0-1")).toBeFocused();
    await expect(status(page)).toHaveAttribute("data-save-status", "saved", { timeout: 15_000 });

    // The network drops: the second direction goes in anyway, in inches, kept on the tablet.
    await context.setOffline(true);
    await page.getByRole("radio", { name: "inch" }).click();
    await page.locator("#cell-0-1").click();
    for (const s of stations) {
      await page.keyboard.type((value(s.key, axes[1].key) / 25.4).toFixed(4));
      await page.keyboard.press("Enter");
    }
    await expect(status(page)).toContainText("Offline — kept on this device", { timeout: 15_000 });
    const kept = await page.evaluate((id) => localStorage.getItem(`kalibore:inspection:${id}`), inspectionId);
    expect(kept).toContain((value(stations.at(-1)!.key, axes[1].key) / 25.4).toFixed(4));
    await shot(page, `inspection-offline-${project}`);
    await context.setOffline(false);
    await expect(status(page)).toHaveAttribute("data-save-status", "saved", { timeout: 30_000 });
    await page.getByRole("radio", { name: "mm" }).click();

    // A reload shows everything the server now holds, the inch cells converted back to mm.
    await page.reload();
    await expect(page.locator("#cell-0-0")).toHaveValue(value(stations[0].key, axes[0].key).toFixed(2));
    await expect(page.getByText(`${stations.length * 2}/${stations.length * 2} read`)).toBeVisible();

    // Any plausibility warning is read and confirmed (the values are last time's plus 0.03 mm).
    const confirm = page.getByRole("button", { name: "The reading is right — confirm" });
    let confirmed = 0;
    while (await confirm.count()) {
      await confirm.first().click();
      confirmed += 1;
    }

    for (const r of rings) {
      await page.locator(`#ring-${r.position}-gap`).fill(((r.gapNewMinMm + r.gapNewMaxMm) / 2 + 0.3).toFixed(2));
      await page.locator(`#ring-${r.position}-groove`).fill(((r.grooveNewMinMm + r.grooveNewMaxMm) / 2).toFixed(2));
      // "Gap measured in" has no default: it is answered, never assumed.
      await page.locator(`label:has(input[name="ring-${r.position}-measured"][value="gauge_ring"])`).click();
    }
    await expect(page.getByText("within the new range").first()).toBeVisible();

    // The crankcase tally: the closing cannot be signed while a count is short.
    const countsIn = page.getByLabel(/count taken in/);
    const countsOut = page.getByLabel(/count brought out/);
    const n = await countsIn.count();
    for (let i = 0; i < n; i++) {
      await countsIn.nth(i).fill(String(2 + i));
      await countsOut.nth(i).fill(String(i === 0 ? 1 : 2 + i));
    }
    await page.locator("#closing-name").scrollIntoViewIfNeeded();
    await expect(page.getByText("Not yet: the tally does not match")).toBeVisible();
    await expect(page.getByRole("button", { name: "Sign now" })).toBeDisabled();
    await countsOut.nth(0).fill("2");
    await page.locator("#closing-name").fill("Second Engineer");
    await page.getByRole("button", { name: "Sign now" }).click();
    await page.getByLabel("Rod nut tightening pressure in bar").fill("1250");
    await page.getByText("Piston rod stuffing box overhauled and checked").click();
    await page.getByText("Cylinder lubrication checked: quills, feed rate, oil").click();
    await shot(page, `inspection-checklist-${project}`);

    // A photo from the "camera": a small PNG made here, uploaded straight to the store.
    const png = await sharp({ create: { width: 320, height: 240, channels: 3, background: { r: 96, g: 104, b: 112 } } }).png().toBuffer();
    await page.locator("#photo-caption").fill("Ring 1 groove, exhaust side");
    await page.locator("#photo-attach").selectOption(rings.length ? "ring:1" : "");
    await page.locator("#photo-file").setInputFiles({ name: "ring-1.png", mimeType: "image/png", buffer: png });
    await expect(page.getByText("✓ stored")).toBeVisible({ timeout: 30_000 });
    await expect(page.locator("#photos img").first()).toBeVisible();

    // "Complete" only when no caution is left; each confirmed warning stays open for the chief to see.
    if (confirmed) {
      await expect(page.getByTestId("submit-cautions").getByText(/confirmed as read/)).toHaveCount(confirmed);
      await expect(page.getByText("Ready to submit, with the cautions above.")).toBeVisible();
    } else {
      await expect(page.getByText("✓ Complete: every reading, ring and checklist item is in")).toBeVisible();
    }
    await expect(status(page)).toHaveAttribute("data-save-status", "saved", { timeout: 15_000 });
    await shot(page, `inspection-sheet-${project}`);
    await page.getByRole("button", { name: "Submit for approval" }).click();
    await expect(page).toHaveURL(new RegExp(`/inspections/${inspectionId}$`));
    await expect(page.getByTestId("inspection-state")).toContainText("Awaiting approval");
    // The engineer has no approve button (the server would refuse anyway).
    await expect(page.getByRole("button", { name: "Approve" })).toHaveCount(0);

    // The chief engineer approves on another device.
    const chiefContext = await browser.newContext({ viewport: page.viewportSize() ?? undefined });
    const chief = await chiefContext.newPage();
    await signIn(chief, DEMO.chief);
    await chief.goto(`/inspections/${inspectionId}`);
    await chief.getByRole("button", { name: "Approve…" }).click();
    await expect(chief.getByTestId("approve-confirm")).toContainText("Maximum wear");
    await chief.getByRole("button", { name: "Approve this record" }).click();
    await expect(chief.getByTestId("inspection-state")).toContainText("Approved");
    // The record shows what changed since the liner's previous gauging (each cell was typed 0.03 mm up).
    await expect(chief.getByTestId("since-previous")).toContainText("Against the previous gauging of this liner");
    await expect(chief.getByText(/^\+0\.0[234] since$/).first()).toBeVisible();
    await expect(chief.getByRole("button", { name: "Amend…" })).toBeVisible();
    await shot(chief, `inspection-approved-${project}`);

    // The unit's history now leads with this overhaul and its numbers.
    await chief.goto(`/units/${unitId}`);
    await expect(chief.getByRole("heading", { name: /Latest gauging/ })).toBeVisible();
    const firstCell = value(stations[0].key, axes[0].key).toFixed(2);
    await expect(chief.locator("table").first().getByText(new RegExp(`^${firstCell} /`)).first()).toBeVisible();
    await expect(chief.getByRole("link", { name: "New inspection" })).toBeVisible();
    await shot(chief, `inspection-unit-${project}`);
    await chiefContext.close();
  });

  test("a gauging sheet opened on this device opens again with no network, and sign-out forgets it", async ({ page, context }) => {
    test.setTimeout(150_000);
    await page.setViewportSize({ width: 820, height: 1180 });
    await signIn(page, DEMO.engineer);
    const started = await startInspection(page, "Cylinder 5", "3/E", 0.02);
    const { stations, axes } = started.analysis.profile;
    const value = (i: number) => started.value(stations[i].key, axes[0].key).toFixed(2);
    await page.getByRole("button", { name: "Open the gauging sheet" }).click();
    await expect(page).toHaveURL(/\/inspections\/\d+\/edit$/);
    const sheetUrl = page.url();

    // The service worker takes charge and keeps a copy of this sheet on the device.
    await expect.poll(() => page.evaluate(() => navigator.serviceWorker?.controller != null), { timeout: 30_000 }).toBe(true);
    await expect
      .poll(() => page.evaluate(async (url) => !!(await (await caches.open("kalibore-pages-v1")).match(url)), sheetUrl), { timeout: 30_000 })
      .toBe(true);
    await page.locator("#cell-0-0").fill(value(0));
    await expect(status(page)).toHaveAttribute("data-save-status", "saved", { timeout: 15_000 });

    // Ring lengths follow the sheet's mm/inch switch, and are converted with it.
    await page.getByRole("radio", { name: "inch" }).click();
    await expect(page.getByText("Closed gap (in)").first()).toBeVisible();
    await page.locator("#ring-1-gap").fill("0.1576");
    await expect(page.getByText("= 4.003 mm as read")).toBeVisible();
    await page.getByRole("radio", { name: "mm" }).click();
    await expect(page.locator("#ring-1-gap")).toHaveValue("4.003");
    await expect(status(page)).toHaveAttribute("data-save-status", "saved", { timeout: 15_000 });

    // No network, and the page is opened again: the device's copy, with the reading saved since.
    await context.setOffline(true);
    await page.reload();
    await expect(page.getByText("No network.", { exact: false }).first()).toBeVisible();
    await expect(page.locator("#cell-0-0")).toHaveValue(value(0));
    await page.locator("#cell-1-0").fill(value(1));
    await expect(status(page)).toContainText("Offline — kept on this device", { timeout: 15_000 });

    // A page never opened on this device says so, instead of the browser's error.
    await page.goto("/units/999999");
    await expect(page.getByRole("heading", { name: "No network" })).toBeVisible();
    await page.goto(sheetUrl);
    await expect(page.locator("#cell-1-0")).toHaveValue(value(1));

    // The network returns: the reading typed offline reaches the server.
    await context.setOffline(false);
    await expect(status(page)).toHaveAttribute("data-save-status", "saved", { timeout: 30_000 });
    await page.reload();
    await expect(page.locator("#cell-1-0")).toHaveValue(value(1));

    // Signing out deletes the device's page copies.
    await page.getByRole("button", { name: "Sign out" }).click();
    await expect(page).toHaveURL(/\/sign-in/);
    const kept = await page.evaluate(async () => (await caches.keys()).filter((k) => k.startsWith("kalibore-pages-")));
    expect(kept).toEqual([]);
  });

  test("the server refuses what a client lets through, in words that name the field", async ({ page }) => {
    await signIn(page, DEMO.engineer);
    await page.goto("/inspections/new");
    // The unit's id from the chooser's link (following it may open a draft another test left there).
    const href = await page.getByRole("link", { name: /Cylinder 5/ }).first().getAttribute("href");
    const unitId = Number(new URL(href!, page.url()).searchParams.get("unit"));
    expect(unitId).toBeGreaterThan(0);
    const res = await page.request.post("/api/inspections", {
      headers: { origin: new URL(page.url()).origin },
      data: { unitId, clientToken: "e2e-text-in-number-0001", inspectedOn: "2026-12-01", engineHours: "a lot", linerHours: 1, linerHoursReason: null, crew: null, gaugeTempC: null, linerTempC: null },
    });
    expect(res.status()).toBe(400);
    const body = await res.json();
    expect(body.details.field).toBe("engineHours");
    expect(body.error).toMatch(/must be a number/);
  });
});
