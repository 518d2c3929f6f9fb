import { expect, test } from "@playwright/test";
import { DEMO, shot, signIn } from "./helpers";

test.describe("[ADMIN] company settings", () => {
  test("a refused value keeps what was typed and names the field; a good one is saved, at phone width", async ({ page }) => {
    await page.setViewportSize({ width: 390, height: 844 });
    await signIn(page, DEMO.admin);
    await page.goto("/admin/companies");
    const horizon = page.getByLabel("Alert horizon (days)").first();
    const currency = page.getByLabel("Currency").first();
    const before = { currency: await currency.inputValue(), horizon: await horizon.inputValue() };
    await currency.fill("eur");
    await horizon.fill("5000");
    await page.getByRole("button", { name: "Save settings" }).first().click();
    await expect(page.getByText("The alert horizon in days is at most 1095.")).toBeVisible();
    await expect(horizon).toHaveValue("5000");
    await expect(currency).toHaveValue("eur");
    const { scroll, client } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, client: document.documentElement.clientWidth }));
    expect(scroll).toBeLessThanOrEqual(client);
    const box = await page.getByRole("button", { name: "Save settings" }).first().boundingBox();
    expect(box!.height).toBeGreaterThanOrEqual(44);
    await shot(page, "company-settings-refused-390");

    await horizon.fill("240");
    await page.getByRole("button", { name: "Save settings" }).first().click();
    await expect(page.getByRole("status").filter({ hasText: /Settings of .* saved\./ })).toBeVisible();
    await page.reload();
    await expect(page.getByLabel("Alert horizon (days)").first()).toHaveValue("240");
    await expect(page.getByLabel("Currency").first()).toHaveValue("EUR");
    for (const [width, height] of [[820, 1180], [1440, 900]] as const) {
      await page.setViewportSize({ width, height });
      await shot(page, `company-settings-${width}`);
    }
    // Put the demo company back as it was, for the tests that read its alerts and costs.
    await page.getByLabel("Currency").first().fill(before.currency);
    await page.getByLabel("Alert horizon (days)").first().fill(before.horizon);
    await page.getByRole("button", { name: "Save settings" }).first().click();
    await expect(page.getByRole("status").filter({ hasText: /saved/ })).toBeVisible();
  });
});
