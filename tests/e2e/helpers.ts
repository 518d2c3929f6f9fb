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
