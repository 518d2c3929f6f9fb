import { readFileSync } from "node:fs";
import knex from "knex";
import { expect, test, type Page } from "@playwright/test";
import { DEMO, DEMO_PASSWORD, shot, signIn } from "./helpers";

/*
 * The importer on the screens, against the production build and the demo data: a gauge file
 * into a draft at tablet width (a row error from a wrong mapping, fixed, then imported), and a
 * ship's past records into a unit that had too few readings for a projection, approved by the
 * chief engineer, after which the unit page projects. Files of our own making.
 */

const db = knex({
  client: "mysql2",
  connection: { host: process.env.DB_HOST ?? "127.0.0.1", port: Number(process.env.DB_PORT ?? 3317), user: process.env.DB_USER, password: process.env.DB_PASSWORD, database: process.env.DB_NAME ?? "kalibore_e2e", dateStrings: true },
  pool: { min: 0, max: 1 },
});
test.afterAll(async () => db.destroy());

async function noSidewaysScroll(page: Page, what: string) {
  const { scroll, client } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, client: document.documentElement.clientWidth }));
  expect(scroll, `${what} scrolls sideways`).toBeLessThanOrEqual(client);
}

/** Visible buttons, selects and text inputs smaller than a gloved finger's 44 × 44 CSS px. */
async function smallTargets(page: Page): Promise<string[]> {
  return page.evaluate(() =>
    [...document.querySelectorAll<HTMLElement>("main button, main select, main input:not([type=radio]):not([type=checkbox]):not([type=file]), main a.inline-flex")]
      .filter((el) => el.offsetParent !== null)
      .map((el) => ({ el, r: el.getBoundingClientRect() }))
      .filter(({ r }) => r.height < 44 || r.width < 44)
      .map(({ el, r }) => `${el.tagName} ${el.textContent?.trim().slice(0, 30) || el.id} ${Math.round(r.width)}×${Math.round(r.height)}`),
  );
}

async function checkWidths(page: Page, name: string) {
  for (const [w, h] of [[390, 844], [820, 1180], [1440, 900]] as const) {
    await page.setViewportSize({ width: w, height: h });
    await page.waitForTimeout(150);
    await noSidewaysScroll(page, `${name} at ${w} px`);
    if (w < 1000) expect(await smallTargets(page), `${name} at ${w} px: small tap targets`).toEqual([]);
    await shot(page, `imports-${name}-${w}`);
  }
}

test.describe("[ENGINEER][IMPORT] a gauge file into a draft @tablet", () => {
  let unitId = 0;
  let draftId: number | null = null;

  test.beforeAll(async () => {
    // Vessel 1's engine is the demo's 640 mm design, as the clean fixture; a unit with no open draft.
    const rows = await db("cylinder_units as u")
      .join("main_engines as e", "e.id", "u.engine_id")
      .join("user_vessels as uv", "uv.vessel_id", "e.vessel_id")
      .join("user as p", "p.id", "uv.user_id")
      .where("p.email", DEMO.engineer)
      .whereNotExists(db("inspections as i").whereRaw("i.unit_id = u.id").whereIn("i.state", ["draft", "returned", "submitted"]))
      .orderBy("u.cylinder_no", "desc")
      .select("u.id");
    unitId = rows[0].id;
  });

  test.afterAll(async () => {
    // Leave the demo as it was for the other browser tests: the draft goes, the import log stays.
    if (draftId) await db("inspections").where({ id: draftId, state: "draft" }).delete();
  });

  test("upload, map, see a row error, fix the mapping, import into a new draft", async ({ page }, info) => {
    test.skip(info.project.name !== "tablet", "tablet width only");
    await signIn(page, DEMO.engineer);
    await page.goto(`/units/${unitId}`);
    await page.getByRole("link", { name: "Import a gauge file" }).click();
    await expect(page.getByRole("heading", { name: "Import readings from a file" })).toBeVisible();
    await expect(page.getByLabel("Unit", { exact: true })).toHaveValue(String(unitId));
    await expect(page.getByLabel("Draft", { exact: true })).toHaveValue("new");
    const log = await db("running_hours_log as l").join("cylinder_units as u", "u.engine_id", "l.engine_id").where("u.id", unitId).orderBy("l.logged_on", "desc").first("l.logged_on", "l.engine_hours");
    await page.getByLabel("Date of the gauging").fill(String(log.logged_on).slice(0, 10));
    await page.getByLabel("Engine running hours").fill(String(Number(log.engine_hours)));

    await page.getByLabel("Reading file").setInputFiles({ name: "gauge-stand.csv", mimeType: "text/csv", buffer: Buffer.from(readFileSync("fixtures/imports/clean.csv")) });
    await expect(page.getByText("22 rows, 15 columns")).toBeVisible();
    await expect(page.getByLabel("Direction", { exact: true })).toHaveValue("6");
    await checkWidths(page, "mapping");
    // A slip in the mapping: the station column taken for the direction.
    await page.getByLabel("Direction", { exact: true }).selectOption("4");
    await page.getByRole("button", { name: "Check the file" }).click();
    await expect(page.getByRole("heading", { name: /Rows with errors/ })).toBeVisible();
    await expect(page.getByText(/Line 2[^0-9].*Direction "T" is neither fa/)).toBeVisible();
    await expect(page.getByRole("button", { name: /Import into the draft/ })).toHaveCount(0);
    await checkWidths(page, "row-errors");

    await page.getByRole("link", { name: "Change the column mapping" }).click();
    await expect(page.getByLabel("Direction", { exact: true })).toHaveValue("4");
    await page.getByLabel("Direction", { exact: true }).selectOption("6");
    // The file names cylinder 1 on every row; the gauge stand's file is for the unit chosen above.
    await page.getByLabel("Cylinder (unit number)").selectOption("");
    await page.getByRole("button", { name: "Check the file" }).click();
    await expect(page.getByText(/^22 rows read, 1 gauging with 18 diameters/)).toBeVisible();
    await expect(page.getByRole("heading", { name: /Rows with errors/ })).toHaveCount(0);
    const confirm = page.getByRole("checkbox", { name: /I have checked the/ });
    if (await confirm.count()) await confirm.check();
    await checkWidths(page, "preview");
    await page.getByRole("button", { name: "Import into the draft" }).click();
    await expect(page.getByText("Imported", { exact: false }).first()).toBeVisible();
    const sheet = page.getByRole("link", { name: "Open the draft sheet" });
    await expect(sheet).toBeVisible();
    draftId = Number((await sheet.getAttribute("href"))!.split("/")[2]);
    expect(await db("liner_readings").where({ inspection_id: draftId }).count({ n: "*" }).first()).toEqual({ n: 18 });
  });
});

test.describe("[CHIEF][IMPORT] past records bring a projection to the unit page", () => {
  test("imports a unit's earlier gaugings, the chief approves, and the unit projects", async ({ browser }) => {
    test.setTimeout(120_000);
    // A unit whose liner has too few gaugings past running-in for a projection (the demo's young ship).
    const units = await db("unit_analysis as a")
      .join("cylinder_units as u", "u.id", "a.unit_id")
      .join("main_engines as e", "e.id", "u.engine_id")
      .join("engine_profiles as p", "p.id", "e.profile_id")
      .join("liners as l", "l.id", "a.liner_id")
      .whereRaw("JSON_VALUE(a.summary, '$.wear.kind') = 'insufficient_data'")
      .where("p.bore_mm", 640)
      .orderBy("u.id")
      .select("u.id", "u.cylinder_no", "u.engine_id", "e.vessel_id", "l.id as liner_id", "l.installed_on", "l.installed_engine_hours", "l.liner_hours_at_install");
    expect(units.length, "the demo has a unit with too few readings for a projection").toBeGreaterThan(0);
    const today = new Date().toISOString().slice(0, 10);
    // For each such unit: running-hours log days on its liner, past running-in (3000 h in the demo profiles), with no record that day.
    const plans = [];
    for (const u of units) {
      const taken = new Set((await db("inspections").where({ unit_id: u.id }).pluck("inspected_on")).map((d: string) => String(d).slice(0, 10)));
      const linerHours = (h: number) => Number(u.liner_hours_at_install) + h - Number(u.installed_engine_hours);
      const log = await db("running_hours_log").where({ engine_id: u.engine_id }).where("logged_on", ">", u.installed_on).where("logged_on", "<=", today).orderBy("logged_on").select("logged_on", "engine_hours");
      const picks = log.filter((l) => linerHours(Number(l.engine_hours)) > 3200 && !taken.has(String(l.logged_on).slice(0, 10)));
      plans.push({ u, picks, linerHours });
    }
    const { u: unit, picks, linerHours } = plans.sort((a, b) => b.picks.length - a.picks.length)[0];
    expect(picks.length, "room for past gaugings").toBeGreaterThanOrEqual(3);
    const crew = await db("user as p").join("user_vessels as uv", "uv.user_id", "p.id").where("uv.vessel_id", unit.vessel_id).select("p.email", "p.role");
    const engineer = crew.find((c) => c.role === "engineer")!.email;
    const chief = crew.find((c) => c.role === "chief_engineer")!.email;
    const chosen = [picks[0], picks[Math.floor(picks.length / 2)], picks[picks.length - 1]];
    // Wear at a normal 0.035 mm / 1000 h (BrightHub Engineering: 0.025–0.05), most at ring 1 at TDC, none in the unworn bands.
    const stations = await db("profile_stations as s").join("main_engines as e", "e.profile_id", "s.profile_id").where("e.id", unit.engine_id).orderBy("s.position").select("s.station_key", "s.role");
    const share: Record<string, number> = { unworn_top: 0, ring_tdc: 1, intermediate: 0.5, lubricator: 0.4, above_ports: 0.2, unworn_bottom: 0 };
    const rows = ["cylinder,date,engine_hours,station,direction,diameter_mm,liner_temp_c,gauge_temp_c,note"];
    for (const l of chosen) {
      const wear = (0.035 * linerHours(Number(l.engine_hours))) / 1000;
      for (const st of stations) for (const axis of ["fa", "ath"]) rows.push(`${unit.cylinder_no},${String(l.logged_on).slice(0, 10)},${Number(l.engine_hours)},${st.station_key},${axis},${(640 + wear * share[st.role] * (axis === "fa" ? 1 : 0.95)).toFixed(3)},25,25,from the paper record book`);
    }
    const file = Buffer.from(`${rows.join("\r\n")}\r\n`);

    const engineerPage = await (await browser.newContext()).newPage();
    await signIn(engineerPage, engineer);
    await engineerPage.goto(`/units/${unit.id}`);
    await expect(engineerPage.getByText(/Wear: not enough data to project/)).toBeVisible();
    await engineerPage.goto(`/imports/new?history=1&engine=${unit.engine_id}`);
    await engineerPage.getByLabel("Reading file").setInputFiles({ name: "record-book.csv", mimeType: "text/csv", buffer: file });
    await expect(engineerPage.getByText(`${rows.length - 1} rows, 9 columns`)).toBeVisible();
    await engineerPage.getByRole("button", { name: "Check the file" }).click();
    await expect(engineerPage.getByText(/3 gaugings with/)).toBeVisible();
    const confirm = engineerPage.getByRole("checkbox", { name: /I have checked the/ });
    if (await confirm.count()) await confirm.check();
    await engineerPage.getByRole("button", { name: "Import the records" }).click();
    await expect(engineerPage.getByText(/waiting for approval by a chief engineer/)).toBeVisible();
    const importId = Number(new URL(engineerPage.url()).pathname.split("/")[2]);
    await engineerPage.close();

    const chiefPage = await (await browser.newContext()).newPage();
    await signIn(chiefPage, chief, DEMO_PASSWORD);
    await chiefPage.goto(`/imports/${importId}`);
    await chiefPage.getByRole("button", { name: "Approve the imported records" }).click();
    await expect(chiefPage.getByText("Imported and approved")).toBeVisible();
    await checkWidths(chiefPage, "approved");
    await chiefPage.goto(`/units/${unit.id}`);
    await expect(chiefPage.getByText(/Wear reaches the [\d.]+ mm limit at about/)).toBeVisible();
    await expect(chiefPage.getByText(/Wear: not enough data to project/)).toHaveCount(0);
    await shot(chiefPage, "imports-unit-projection");
    const trail = await db("audit_log").where({ entity_type: "import", entity_id: String(importId) }).orderBy("id").pluck("action");
    expect(trail).toEqual(["import.commit", "import.approve"]);
  });
});
