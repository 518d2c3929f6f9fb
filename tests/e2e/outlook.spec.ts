import { readFileSync } from "node:fs";
import { expect, test, type Page } from "@playwright/test";
import { DEMO, shot, signIn } from "./helpers";

const SHIP = "Brisemer Tern"; // the demo's vessel 1, the chief's ship
const CHIEF2 = "chief2@brisemer.example"; // chief of vessel 2

async function noSidewaysScroll(page: Page) {
  const { scroll, client } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, client: document.documentElement.clientWidth }));
  expect(scroll).toBeLessThanOrEqual(client);
}

/** The liner line of the shortfall table: [needed, short]. */
async function linerShortfall(page: Page): Promise<[number, number]> {
  const row = page.getByTestId("shortfall-table").locator("tbody tr", { hasText: "Liner" }).first();
  const cells = row.locator("td");
  return [Number(await cells.nth(0).innerText()), Number(await row.getByTestId("short-count").innerText())];
}

test.describe("[SUPERINTENDENT][CHIEF][OUTLOOK] renewal planning", () => {
  test.describe.configure({ timeout: 180_000 });

  test("the superintendent filters the outlook, downloads the CSV, plans a renewal at a port stay; the chief sees it, another chief does not @tablet", async ({ page, browser }, info) => {
    const tag = info.project.name;
    await signIn(page, DEMO.superintendent);
    await page.goto("/outlook");
    await expect(page.getByRole("heading", { name: "Renewal outlook" })).toBeVisible();
    await page.getByLabel("Vessel", { exact: true }).selectOption({ label: SHIP });
    await page.getByLabel("Due within", { exact: true }).selectOption({ label: "12 months" });
    await page.getByRole("button", { name: "Show" }).click();
    await expect(page).toHaveURL(/vessel=\d+/);
    await expect(page).toHaveURL(/horizon=12/);
    const rows = page.getByTestId("outlook-row");
    expect(await rows.count()).toBeGreaterThan(0);
    for (const text of await rows.allInnerTexts()) expect(text).toContain(SHIP);
    await noSidewaysScroll(page);
    await shot(page, `outlook-filtered-${tag}`);

    // The CSV of the same rows: UTF-8 with a byte-order mark, a header, ISO dates, this ship only.
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId("csv-link").click()]);
    expect(download.suggestedFilename()).toMatch(/^renewal-outlook-\d{4}-\d{2}-\d{2}\.csv$/);
    const bytes = readFileSync((await download.path())!);
    expect([...bytes.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const lines = bytes.subarray(3).toString("utf8").trimEnd().split("\r\n");
    const header = lines[0].split(",");
    expect(header.slice(0, 5)).toEqual(["vessel", "engine", "cylinder", "liner", "status"]);
    expect(lines.length - 1).toBe(await rows.count());
    const limitCol = header.indexOf("limit_on");
    for (const line of lines.slice(1)) {
      expect(line.startsWith(`${SHIP},`)).toBe(true);
      const limit = line.split(",")[limitCol];
      if (limit) expect(limit).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    }

    // Plan a liner renewal at a port stay for a unit the outlook says can run on: it now takes a spare.
    await page.goto(`/outlook?vessel=${new URL(page.url()).searchParams.get("vessel")}&recommendation=run_on`);
    const [neededBefore, shortBefore] = await linerShortfall(page);
    const free = rows.filter({ hasNot: page.getByTestId("plan-state") }).first();
    const unitId = await free.getAttribute("data-unit");
    await free.getByRole("button", { name: /^Plan/ }).click();
    const form = page.getByTestId("plan-form");
    const when = form.getByLabel("Opportunity");
    const portStay = (await when.locator("option").allInnerTexts()).find((t) => t.startsWith("Port stay"));
    expect(portStay, "a port stay to plan into").toBeTruthy();
    await when.selectOption({ label: portStay! });
    await form.getByLabel("Part", { exact: true }).selectOption("liner");
    await form.getByRole("button", { name: "Save plan" }).click();
    const planned = page.locator(`[data-unit="${unitId}"]`);
    await expect(planned.getByTestId("plan-state")).toContainText("Pencilled in liner");
    const [neededAfter, shortAfter] = await linerShortfall(page);
    expect(neededAfter).toBe(neededBefore + 1);
    expect(shortAfter).toBeGreaterThanOrEqual(shortBefore);
    await shot(page, `outlook-planned-${tag}`);

    // Planning the same unit again is refused in words, not made twice.
    const again = await page.request.post(`/api/units/${unitId}/plans`, { data: { part: "liner", plannedOn: new Date(Date.now() + 30 * 86_400_000).toISOString().slice(0, 10) }, headers: { origin: new URL(page.url()).origin } });
    expect(again.status()).toBe(409);

    // The chief of that ship sees the plan on his unit page.
    const chiefContext = await browser.newContext({ viewport: page.viewportSize() ?? undefined });
    const chief = await chiefContext.newPage();
    await signIn(chief, DEMO.chief);
    await chief.goto(`/units/${unitId}`);
    await expect(chief.getByTestId("unit-plans")).toContainText("Pencilled in");
    await expect(chief.getByTestId("ring-history")).toBeVisible();
    await noSidewaysScroll(chief);
    await shot(chief, `outlook-chief-unit-${tag}`);
    await chiefContext.close();

    // A chief of another ship sees none of it: not the unit, not the ship in the outlook or its API.
    const otherContext = await browser.newContext({ viewport: page.viewportSize() ?? undefined });
    const other = await otherContext.newPage();
    await signIn(other, CHIEF2);
    const res = await other.goto(`/units/${unitId}`);
    expect(res?.status()).toBe(404);
    await other.goto("/outlook");
    await expect(other.getByTestId("outlook-table")).not.toContainText(SHIP);
    const api = await (await other.request.get("/api/outlook")).json();
    expect(api.rows.length).toBeGreaterThan(0);
    expect(api.rows.some((r: { vesselName: string }) => r.vesselName === SHIP)).toBe(false);
    await otherContext.close();
  });

  test("the planning screens fit a phone, a tablet and a desk without sideways scrolling", async ({ page }) => {
    await signIn(page, DEMO.superintendent);
    for (const [width, height] of [[390, 844], [820, 1180], [1440, 900]] as const) {
      await page.setViewportSize({ width, height });
      for (const [path, name] of [["/outlook", "outlook"], ["/outlook/schedule", "schedule"], ["/outlook/spares", "spares"]] as const) {
        await page.goto(path);
        await expect(page.locator("main h1")).toBeVisible();
        await noSidewaysScroll(page);
        await shot(page, `${name}-${width}`);
      }
    }
    // The engine page's small multiples and the unit page's ring history, at 390 px.
    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto("/fleet");
    await page.locator("main h2 a", { hasText: SHIP }).click();
    await page.getByRole("link", { name: "Units and wear →" }).first().click();
    await expect(page.getByTestId("trend-multiples").locator("li")).toHaveCount(6);
    await expect(page.getByTestId("trend-multiples")).toContainText("percentile");
    await noSidewaysScroll(page);
    await shot(page, "engine-multiples-390");
  });
});
