import knex from "knex";
import { expect, test, type Page } from "@playwright/test";
import { DEMO, DEMO_PASSWORD, shot } from "./helpers";

/*
 * Against the production server (scripts/serve.ts) and the demo data: where sign-in may
 * send the browser, which address the server records, which better-auth endpoints exist,
 * and how a chief engineer's own record reaches a second approver on the screens.
 */

async function signInThroughForm(page: Page, email: string, next?: string) {
  await page.goto(next === undefined ? "/sign-in" : `/sign-in?next=${next}`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
}

test.describe("[AUTH] sign-in", () => {
  test("sends the browser only to a path on this site after signing in", async ({ page, baseURL }) => {
    const origin = new URL(baseURL!).origin;
    // The form: a return address that parses to another host goes home instead.
    await signInThroughForm(page, DEMO.chief, "/%5Cevil.example");
    expect(new URL(page.url()).origin).toBe(origin);
    expect(new URL(page.url()).pathname).toBe("/");
    // Signed in, the sign-in page sends the browser on at once, by the same rule.
    for (const next of ["/%09/evil.example", "//evil.example", "https://evil.example/", "/%5C%5Cevil.example"]) {
      await page.goto(`/sign-in?next=${next}`);
      await expect(page).toHaveURL(`${origin}/`);
    }
    await page.goto(`/sign-in?next=${encodeURIComponent("/fleet?x=1")}`);
    await expect(page).toHaveURL(`${origin}/fleet?x=1`);
  });

  test("records the address of the connection, not a client's X-Forwarded-For", async ({ playwright, baseURL }) => {
    const api = await playwright.request.newContext({ baseURL, extraHTTPHeaders: { origin: new URL(baseURL!).origin, "x-forwarded-for": "203.0.113.9" } });
    const res = await api.post("/api/auth/sign-in/email", { data: { email: DEMO.engineer, password: DEMO_PASSWORD } });
    expect(res.status()).toBe(200);
    const session = await (await api.get("/api/auth/get-session")).json();
    expect(session.session.ipAddress).toBe("127.0.0.1");
    expect(session.session).not.toHaveProperty("token");
    for (const [method, path] of [["GET", "/api/auth/list-sessions"], ["POST", "/api/auth/admin/impersonate-user"], ["POST", "/api/auth/admin/set-role"]] as const) {
      const r = method === "GET" ? await api.get(path) : await api.post(path, { data: {} });
      expect(r.status(), `${method} ${path}`).toBe(404);
    }
    await api.dispose();
  });
});

test.describe("[APPROVAL] a chief engineer's own record goes to a second approver", () => {
  // The demo's submitted record was entered by the engineer; for this test the chief
  // entered and submitted it himself, then it is put back.
  const db = knex({
    client: "mysql2",
    connection: { host: process.env.DB_HOST ?? "127.0.0.1", port: Number(process.env.DB_PORT ?? 3317), user: process.env.DB_USER, password: process.env.DB_PASSWORD, database: process.env.DB_NAME ?? "kalibore_e2e" },
    pool: { min: 0, max: 1 },
  });
  let record: { id: number; created_by: string; submitted_by: string } | undefined;

  test.beforeAll(async () => {
    const chief = await db("user").where({ email: DEMO.chief }).first("id");
    record = await db("inspections as i")
      .join("cylinder_units as u", "u.id", "i.unit_id")
      .join("main_engines as e", "e.id", "u.engine_id")
      .join("user_vessels as uv", "uv.vessel_id", "e.vessel_id")
      .where({ "i.state": "submitted", "uv.user_id": chief.id })
      .first("i.id", "i.created_by", "i.submitted_by");
    if (!record) throw new Error("the demo has no submitted record on the chief's vessel");
    await db("inspections").where({ id: record.id }).update({ created_by: chief.id, submitted_by: chief.id });
  });
  test.afterAll(async () => {
    if (record) await db("inspections").where({ id: record.id }).update({ created_by: record.created_by, submitted_by: record.submitted_by });
    await db.destroy();
  });

  for (const [label, width, height] of [["phone", 390, 844], ["tablet", 820, 1180], ["desk", 1440, 900]] as const) {
    test(`home, record and fleet screens say who approves (${label})`, async ({ browser }, info) => {
      const context = await browser.newContext({ viewport: { width, height }, hasTouch: label !== "desk" });
      const chief = await context.newPage();
      await signInThroughForm(chief, DEMO.chief);
      const own = chief.getByRole("region", { name: /Waiting for another approver/ });
      await expect(own).toBeVisible();
      await expect(own).toContainText("another chief engineer of the vessel or the superintendent");
      await expect(chief.getByRole("region", { name: /Awaiting your approval/ }).locator(`a[href="/inspections/${record!.id}"]`)).toHaveCount(0);
      expect(await chief.evaluate(() => document.documentElement.scrollWidth <= document.documentElement.clientWidth)).toBe(true);
      await shot(chief, `approval-chief-home-${label}-${info.project.name}`);

      await own.locator(`a[href="/inspections/${record!.id}"]`).click();
      await expect(chief.getByText(/You entered this record, so someone else checks it/)).toBeVisible();
      await expect(chief.getByRole("button", { name: "Approve" })).toHaveCount(0);
      expect(await chief.evaluate(() => document.documentElement.scrollWidth <= document.documentElement.clientWidth)).toBe(true);
      await shot(chief, `approval-chief-record-${label}-${info.project.name}`);
      await context.close();

      const supContext = await browser.newContext({ viewport: { width, height }, hasTouch: label !== "desk" });
      const supt = await supContext.newPage();
      await signInThroughForm(supt, DEMO.superintendent);
      const queue = supt.getByRole("region", { name: /Waiting for your approval/ });
      await expect(queue).toBeVisible();
      const link = queue.locator(`a[href="/inspections/${record!.id}"]`);
      await expect(link).toBeVisible();
      const box = await link.boundingBox();
      expect(box!.height).toBeGreaterThanOrEqual(44);
      expect(await supt.evaluate(() => document.documentElement.scrollWidth <= document.documentElement.clientWidth)).toBe(true);
      await shot(supt, `approval-supt-fleet-${label}-${info.project.name}`);
      await link.click();
      await expect(supt.getByRole("button", { name: "Approve" })).toBeVisible();
      await supContext.close();
    });
  }
});
