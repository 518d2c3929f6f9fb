import { expect, test } from "@playwright/test";
import { DEMO, shot, signIn } from "./helpers";

test.describe("[SUPERINTENDENT][FLEET] fleet → vessel → engine → unit", () => {
  test("a signed-out visitor is sent to sign-in", async ({ page }) => {
    await page.goto("/fleet");
    await expect(page).toHaveURL(/\/sign-in/);
    await expect(page.getByRole("heading", { name: "Sign in" })).toBeVisible();
  });

  test("the superintendent walks from the fleet down to one unit's history @tablet", async ({ page }) => {
    await signIn(page, DEMO.superintendent);
    await page.goto("/fleet");
    await expect(page.getByRole("heading", { name: "Fleet", level: 1 })).toBeVisible();
    const vesselLinks = page.locator("main h2 a");
    expect(await vesselLinks.count()).toBeGreaterThanOrEqual(4);
    await shot(page, `fleet-${test.info().project.name}`);

    await vesselLinks.first().click();
    await expect(page.getByText("IMO number")).toBeVisible();
    await page.getByRole("link", { name: "Units and wear →" }).first().click();
    await expect(page.getByRole("heading", { name: "Units at a glance" })).toBeVisible();
    const unitRows = page.locator("tbody tr");
    expect(await unitRows.count()).toBeGreaterThanOrEqual(6);
    // Every unit shows a status in words, not colour alone.
    await expect(page.locator("tbody").getByText(/Steady|Watch|Over limit|Renew before next overhaul|Too few readings/).first()).toBeVisible();
    await shot(page, `engine-${test.info().project.name}`);

    await page.getByRole("link", { name: /^Cyl\. 1$/ }).first().click();
    await expect(page.getByRole("heading", { name: "Cylinder 1" })).toBeVisible();
    await expect(page.getByRole("heading", { name: "Wear trend" })).toBeVisible();
    await expect(page.getByRole("heading", { name: /Latest gauging/ })).toBeVisible();
    await expect(page.getByText(/Limit \d+\.\d\d mm/).first()).toBeVisible();
    await shot(page, `unit-${test.info().project.name}`);
  });

  test("the API refuses a unit outside the engineer's vessel with 404 and answers its own", async ({ page }) => {
    await signIn(page, DEMO.engineer);
    await page.goto("/fleet");
    const vessels = page.locator("main h2 a");
    await expect(vessels).toHaveCount(1);
    await vessels.first().click();
    await page.getByRole("link", { name: "Units and wear →" }).first().click();
    await page.getByRole("link", { name: /^Cyl\. 1$/ }).first().click();
    const unitId = page.url().split("/").pop();
    const own = await page.request.get(`/api/units/${unitId}/analysis`);
    expect(own.status()).toBe(200);
    const body = await own.json();
    expect(body.summary.band.band).toMatch(/over_limit|renew_before_next|watch|steady|unknown/);
    const foreign = await page.request.get(`/api/units/99999/analysis`);
    expect(foreign.status()).toBe(404);
  });

  test("health answers without a session", async ({ request }) => {
    const res = await request.get("/api/health");
    expect(res.status()).toBe(200);
    expect((await res.json()).ok).toBe(true);
  });
});
