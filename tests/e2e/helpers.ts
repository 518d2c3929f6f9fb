import { expect, type Page } from "@playwright/test";

export const DEMO_PASSWORD = "Kalibore-demo-1";

export const DEMO = {
  admin: "admin@brisemer.example",
  superintendent: "supt@brisemer.example",
  chief: "chief@brisemer.example",
  engineer: "engineer@brisemer.example",
} as const;

/** Signs in through the real form, as a person would. */
export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).not.toHaveURL(/\/sign-in/);
}

export async function shot(page: Page, name: string) {
  await page.screenshot({ path: `.test-data/screens/${name}.png`, fullPage: true });
}

/**
 * Opens a new inspection of a cylinder on the signed-in person's vessel and its gauging sheet:
 * today's counter from the engine's log, 20 °C for the micrometer and the liner. Answers the
 * inspection's id and the profile's bore.
 */
export async function openNewSheet(page: Page, cylinder: RegExp, crew = "3/E") {
  await page.goto("/inspections/new");
  await page.getByRole("link", { name: cylinder }).first().click();
  await expect(page).toHaveURL(/unit=\d+/);
  const unitId = Number(new URL(page.url()).searchParams.get("unit"));
  const analysis = (await (await page.request.get(`/api/units/${unitId}/analysis`)).json()) as { context: { engineId: number }; profile: { boreMm: number } };
  const engine = (await (await page.request.get(`/api/engines/${analysis.context.engineId}/analysis`)).json()) as { latestHours: { engineHours: number } };
  await page.getByLabel("Engine running hours (counter)").fill(String(Math.round(engine.latestHours.engineHours)));
  await page.getByLabel("Crew (who gauged)").fill(crew);
  await page.getByLabel("Micrometer temperature").fill("20");
  await page.getByLabel("Liner temperature").fill("20");
  await page.getByRole("button", { name: "Open the gauging sheet" }).click();
  await expect(page).toHaveURL(/\/inspections\/\d+\/edit$/);
  return { inspectionId: Number(page.url().match(/inspections\/(\d+)\/edit/)![1]), unitId, boreMm: analysis.profile.boreMm };
}

/** Discards a draft this test opened (as its author), so the unit is free for the tests after it. */
export async function discardDraft(page: Page, inspectionId: number) {
  const res = await page.request.delete(`/api/inspections/${inspectionId}`, { headers: { origin: new URL(page.url()).origin } });
  expect(res.status(), await res.text()).toBe(200);
}
