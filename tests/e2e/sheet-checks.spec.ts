import { expect, test, type Page } from "@playwright/test";
import { DEMO, shot, signIn } from "./helpers";

/*
 * The gauging sheet catching a tired engineer's mistakes, at tablet (820×1180) and phone
 * (390×844) size with touch: an impossible reading that cannot be confirmed, commas read by
 * the field and echoed as typed, one warning for a sheet of identical values, swapped
 * directions put right in one tap, "gap measured in" asked rather than assumed, the rod nut
 * pressure blocked beyond its tolerance with the hydraulic-tool caution shown, open cautions
 * in the submit summary, a submit from a stale copy refused as a conflict, and the chief's
 * approval asked with the numbers that matter.
 */

type Analysis = {
  context: { engineId: number };
  profile: { boreMm: number; stations: { key: string }[]; axes: { key: string; label: string }[]; rings: { position: number; gapNewMinMm: number; gapNewMaxMm: number; grooveNewMinMm: number; grooveNewMaxMm: number }[] };
  latest: { cells: { stationKey: string; axisKey: string; correctedMm: number }[] } | null;
};

const status = (page: Page) => page.locator("[data-save-status]");
const grouped = (n: number) => String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ",");

async function noSidewaysScroll(page: Page) {
  const { sw, cw } = await page.evaluate(() => ({ sw: document.documentElement.scrollWidth, cw: document.documentElement.clientWidth }));
  expect(sw, "the page scrolls sideways").toBeLessThanOrEqual(cw);
}

/** Opens a new inspection's sheet for a cylinder of the engineer's vessel; the engine hours are typed with a comma between thousands. */
async function openSheet(page: Page, cylinder: RegExp) {
  await page.goto("/inspections/new");
  await page.getByRole("link", { name: cylinder }).first().click();
  await expect(page).toHaveURL(/unit=\d+/);
  const unitId = Number(new URL(page.url()).searchParams.get("unit"));
  const analysis = (await (await page.request.get(`/api/units/${unitId}/analysis`)).json()) as Analysis;
  const engine = await (await page.request.get(`/api/engines/${analysis.context.engineId}/analysis`)).json();
  const hours = Math.round(engine.latestHours.engineHours);
  const last = analysis.latest?.cells ?? [];
  const prev = (stationKey: string, axisKey: string) => last.find((c) => c.stationKey === stationKey && c.axisKey === axisKey)?.correctedMm ?? analysis.profile.boreMm + 0.2;
  // "46,600" engine hours: a counter is never a fraction of its last reading.
  await page.getByLabel("Engine running hours (counter)").fill(grouped(hours));
  await page.getByLabel("Crew (who gauged)").fill("3/E");
  await page.getByLabel("Micrometer temperature").fill("20");
  await page.getByLabel("Liner temperature").fill("20");
  await page.getByRole("button", { name: "Open the gauging sheet" }).click();
  await expect(page).toHaveURL(/\/inspections\/\d+\/edit$/);
  const inspectionId = Number(page.url().match(/inspections\/(\d+)\/edit/)![1]);
  return { inspectionId, hours, analysis, prev };
}

async function fillColumn(page: Page, column: number, values: string[]) {
  for (let i = 0; i < values.length; i++) await page.locator(`#cell-${i}-${column}`).fill(values[i]);
}

test.describe("[ENGINEER][CHIEF][SHEET] the sheet catches mistakes", () => {
  test.describe("at tablet size", () => {
    test.use({ viewport: { width: 820, height: 1180 }, hasTouch: true });

    test("impossible values, commas, swapped directions, gap place, rod nut pressure, stale submit and the approval summary", async ({ page, browser }) => {
      test.setTimeout(240_000);
      await signIn(page, DEMO.engineer);
      const { inspectionId, hours, analysis, prev } = await openSheet(page, /Cylinder 1\b/);
      const { stations, axes, rings } = analysis.profile;
      const up = (s: string, a: string) => (Math.round((prev(s, a) + 0.03) * 100) / 100).toFixed(2);

      // The engine hours typed as "46,600" were read as 46 600 h, not 46.6 h.
      expect((await (await page.request.get(`/api/inspections/${inspectionId}`)).json()).draft.header.engineHours).toBe(hours);

      // Every cell the same value: said once, with one confirmation for the whole sheet.
      const bore = analysis.profile.boreMm.toFixed(2);
      const same = (analysis.profile.boreMm + 0.4).toFixed(2);
      for (const [ai] of axes.entries()) await fillColumn(page, ai, stations.map(() => same));
      await expect(page.getByTestId("sheet-findings").getByText(`Every cell holds the same value, ${same} mm`)).toHaveCount(1);
      await expect(page.getByTestId("submit-problems").getByText(/Every cell holds the same value/)).toHaveCount(1);
      await expect(page.getByRole("button", { name: "The reading is right — confirm" })).toHaveCount(0);
      await noSidewaysScroll(page);
      await shot(page, "sheet-same-value-tablet");

      // The directions entered the other way round: named, and put right with one tap.
      await fillColumn(page, 0, stations.map((s) => up(s.key, axes[1].key)));
      await fillColumn(page, 1, stations.map((s) => up(s.key, axes[0].key)));
      await expect(page.getByTestId("sheet-findings").getByText(/fit the previous gauging far better with fore–aft and athwartships exchanged/)).toBeVisible();
      await shot(page, "sheet-swapped-tablet");
      await page.getByRole("button", { name: "Swap fore–aft and athwartships" }).click();
      await expect(page.getByText(/exchanged/)).toHaveCount(0);
      await expect(page.locator("#cell-0-0")).toHaveValue(up(stations[0].key, axes[0].key));

      // A dropped digit (60.xx for 600.xx) is an error: no confirm button, submission blocked.
      const good = up(stations[1].key, axes[0].key);
      await page.locator("#cell-1-0").fill(good.slice(0, 2) + good.slice(3));
      const cellError = page.getByTestId("cell-error");
      await expect(cellError).toContainText(`a tenth of the ${bore} mm bore`);
      await expect(cellError).toContainText("This cannot be confirmed");
      await expect(page.locator("#cell-1-0-help").getByRole("button", { name: /confirm/ })).toHaveCount(0);
      await shot(page, "sheet-impossible-tablet");
      await page.locator("#cell-1-0").fill(good);
      await expect(cellError).toHaveCount(0);
      // The value as read is shown beside the input, in the sheet's unit.
      await expect(page.locator("#cell-1-0-help").getByTestId("parsed-echo")).toHaveText(`= ${Number(good)} mm`);
      const confirm = page.getByRole("button", { name: "The reading is right — confirm" });
      while (await confirm.count()) await confirm.first().click();

      // Rings: "gap measured in" has no default and is asked for once a gap is typed.
      for (const r of rings) {
        await page.locator(`#ring-${r.position}-gap`).fill(((r.gapNewMinMm + r.gapNewMaxMm) / 2).toFixed(2));
        await page.locator(`#ring-${r.position}-groove`).fill(((r.grooveNewMinMm + r.grooveNewMaxMm) / 2).toFixed(2));
      }
      await expect(page.getByTestId(`ring-${rings[0].position}-place-missing`)).toBeVisible();
      await expect(page.getByTestId("submit-problems")).toContainText("say where the closed gap was measured");
      for (const r of rings) await page.locator(`label:has(input[name="ring-${r.position}-measured"][value="gauge_ring"])`).click();
      await expect(page.getByTestId(`ring-${rings[0].position}-place-missing`)).toHaveCount(0);

      // Checklist: tally, signature, items.
      const countsIn = page.getByLabel(/count taken in/);
      const countsOut = page.getByLabel(/count brought out/);
      for (let i = 0; i < (await countsIn.count()); i++) {
        await countsIn.nth(i).fill("2");
        await countsOut.nth(i).fill("2");
      }
      await page.locator("#closing-name").fill("Second Engineer");
      await page.getByRole("button", { name: "Sign now" }).click();
      await page.getByText("Piston rod stuffing box overhauled and checked").click();
      await page.getByText("Cylinder lubrication checked: quills, feed rate, oil").click();

      // Rod nut pressure: "1,250" is 1 250 bar; −12 % blocks; −4 % is an open caution; the hydraulic-tool caution is shown.
      const pressure = page.getByLabel("Rod nut tightening pressure in bar");
      await pressure.fill("1,250");
      await expect(page.getByText("= 1 250 bar")).toBeVisible();
      await expect(page.getByTestId("rodnut-caution")).toContainText("never stand in line with the stud");
      await pressure.fill("1100");
      await expect(page.getByTestId("rodnut-error")).toContainText("beyond the ±10 % allowed");
      await expect(page.getByTestId("submit-problems")).toContainText("Rod nut pressure 1 100 bar");
      await expect(page.getByRole("button", { name: "Submit for approval" })).toBeDisabled();
      await pressure.fill("1200");
      await expect(page.getByTestId("rodnut-warning")).toBeVisible();
      await expect(page.getByTestId("submit-problems")).toHaveCount(0);
      await expect(page.getByTestId("submit-cautions")).toContainText("Rod nut pressure 1 200 bar");
      await expect(page.getByTestId("submit-complete")).toHaveCount(0);
      await noSidewaysScroll(page);
      await shot(page, "sheet-cautions-tablet");
      await expect(status(page)).toHaveAttribute("data-save-status", "saved", { timeout: 15_000 });

      // Another device saves the draft meanwhile; this device's submit names the revision it saved, so it is a conflict.
      const server = await (await page.request.get(`/api/inspections/${inspectionId}`)).json();
      const put = await page.request.put(`/api/inspections/${inspectionId}`, {
        headers: { origin: new URL(page.url()).origin },
        data: { revision: server.revision, draft: { ...server.draft, header: { ...server.draft.header, crew: "3/E, saved on the other tablet" } } },
      });
      expect(put.status()).toBe(200);
      await page.getByRole("button", { name: "Submit for approval" }).click();
      await expect(page.getByText("This draft was changed elsewhere")).toBeVisible();
      expect((await (await page.request.get(`/api/inspections/${inspectionId}`)).json()).state).toBe("draft");
      await page.getByRole("button", { name: "Take the other copy (discard mine)" }).click();
      await page.getByRole("button", { name: "Submit for approval" }).click();
      await expect(page).toHaveURL(new RegExp(`/inspections/${inspectionId}$`));
      await expect(page.getByTestId("inspection-state")).toContainText("Awaiting approval");

      // The chief is asked to confirm, with max wear, rate, limit and the open cautions.
      const chiefContext = await browser.newContext({ viewport: { width: 820, height: 1180 }, hasTouch: true });
      const chief = await chiefContext.newPage();
      await signIn(chief, DEMO.chief);
      await chief.goto(`/inspections/${inspectionId}`);
      await chief.getByRole("button", { name: "Approve…" }).click();
      const ask = chief.getByTestId("approve-confirm");
      await expect(ask).toContainText("Maximum wear");
      await expect(ask).toContainText("Wear rate since the previous gauging");
      await expect(ask).toContainText(/Limit: .*(running hours|limit)/);
      await expect(chief.getByTestId("approve-cautions")).toContainText("Rod nut pressure 1 200 bar");
      await noSidewaysScroll(chief);
      await shot(chief, "sheet-approve-confirm-tablet");
      await chief.getByRole("button", { name: "Approve this record" }).click();
      await expect(chief.getByTestId("inspection-state")).toContainText("Approved");
      await chiefContext.close();
    });
  });

  test.describe("at phone size", () => {
    test.use({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true });

    test("an ambiguous comma is asked about, an impossible value is refused, nothing scrolls sideways", async ({ page }) => {
      test.setTimeout(120_000);
      await signIn(page, DEMO.engineer);
      const { inspectionId, analysis } = await openSheet(page, /Cylinder 6\b/);
      const bore = analysis.profile.boreMm.toFixed(2);

      // "1,250" in a field with nothing to settle it: asked, with one tap for each reading.
      await page.locator("#h-gauge").fill("1,250");
      const question = page.getByRole("alert").filter({ hasText: "“1,250”" });
      await expect(question).toContainText("1 250 °C or 1.25 °C?");
      const choice = question.getByRole("button", { name: "1.25 °C" });
      const box = await choice.boundingBox();
      expect(box!.height).toBeGreaterThanOrEqual(44);
      expect(box!.width).toBeGreaterThanOrEqual(44);
      await noSidewaysScroll(page);
      await shot(page, "sheet-ambiguous-phone");
      await choice.click();
      await expect(page.locator("#h-gauge")).toHaveValue("1.25");
      await page.locator("#h-gauge").fill("20");

      // An impossible diameter: an error, never a confirm button.
      const slipped = (analysis.profile.boreMm / 10 + 0.004).toFixed(2); // a digit dropped: 64.00 for 640.04
      await page.locator("#cell-0-0").fill(slipped);
      await expect(page.getByTestId("cell-error")).toContainText(`a tenth of the ${bore} mm bore`);
      await expect(page.locator("#cell-0-0-help").getByRole("button", { name: /confirm/ })).toHaveCount(0);
      await noSidewaysScroll(page);
      await shot(page, "sheet-impossible-phone");
      await expect(status(page)).toHaveAttribute("data-save-status", "saved", { timeout: 15_000 });
      // The draft keeps what was typed; the server would not take it into a record.
      const res = await page.request.post(`/api/inspections/${inspectionId}/submit`, { headers: { origin: new URL(page.url()).origin }, data: {} });
      expect(res.status()).toBe(400);
      expect(JSON.stringify(await res.json())).toContain(`about a tenth of the ${bore} mm bore`);
    });
  });
});
