import { existsSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { simpleParser, type ParsedMail } from "mailparser";
import { expect, test, type Browser, type Page } from "@playwright/test";
import { DEMO, shot, signIn } from "./helpers";

/*
 * Alerts by e-mail against the production server, the demo data and the SMTP capture fake:
 * the engineer submits, the chief's mail arrives with a link to the record; the chief approves
 * a record with a reading over the limit, the superintendent's alert arrives and its link opens
 * the unit. Then the notifications, preferences and the administrator's undelivered list at
 * phone, tablet and desk width.
 */

const MAIL_DIR = path.resolve(process.env.MAIL_FAKE_DIR ?? ".data/mail");

type Analysis = {
  context: { engineId: number };
  profile: {
    boreMm: number;
    linerWearLimitMm: number;
    stations: { key: string; role: string }[];
    axes: { key: string }[];
    rings: { position: number; gapNewMinMm: number; gapNewMaxMm: number; grooveNewMinMm: number; grooveNewMaxMm: number }[];
  };
  latest: { cells: { stationKey: string; axisKey: string; correctedMm: number }[] } | null;
};

/** The newest captured mail to `to` whose subject and text contain what is asked, waiting for it. */
async function mailTo(to: string, subject: string, text: string, timeoutMs = 30_000): Promise<ParsedMail> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (existsSync(MAIL_DIR)) {
      for (const f of readdirSync(MAIL_DIR).filter((n) => n.endsWith(".eml")).sort().reverse()) {
        const raw = readFileSync(path.join(MAIL_DIR, f), "utf8");
        if (!raw.includes(to)) continue;
        const mail = await simpleParser(raw);
        if ((mail.subject ?? "").includes(subject) && (mail.text ?? "").includes(text)) return mail;
      }
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`no e-mail "${subject}" to ${to} containing ${text} in ${MAIL_DIR}`);
}

async function noSidewaysScroll(page: Page) {
  const { sw, cw } = await page.evaluate(() => ({ sw: document.documentElement.scrollWidth, cw: document.documentElement.clientWidth }));
  expect(sw, "the page scrolls sideways").toBeLessThanOrEqual(cw);
}

async function as(browser: Browser, email: string, viewport = { width: 1440, height: 900 }) {
  const context = await browser.newContext({ viewport, hasTouch: viewport.width < 1000 });
  const page = await context.newPage();
  await signIn(page, email);
  return { context, page };
}

test.describe("[ENGINEER][CHIEF][SUPT][ALERTS] alerts by e-mail", () => {
  test("the chief hears of a submitted record; the superintendent of an approval over the limit, and the link opens the unit", async ({ page, browser, baseURL }) => {
    test.setTimeout(180_000);
    await signIn(page, DEMO.engineer);
    await page.goto("/inspections/new");
    await page.getByRole("link", { name: /Cylinder 4\b/ }).first().click();
    await expect(page).toHaveURL(/unit=\d+/);
    const unitId = Number(new URL(page.url()).searchParams.get("unit"));
    const analysis = (await (await page.request.get(`/api/units/${unitId}/analysis`)).json()) as Analysis;
    const engine = await (await page.request.get(`/api/engines/${analysis.context.engineId}/analysis`)).json();
    await page.getByLabel("Engine running hours (counter)").fill(String(Math.round(engine.latestHours.engineHours)));
    await page.getByLabel("Crew (who gauged)").fill("2/E and fitter");
    await page.getByLabel("Micrometer temperature").fill("20");
    await page.getByLabel("Liner temperature").fill("20");
    await page.getByRole("button", { name: "Open the gauging sheet" }).click();
    await expect(page).toHaveURL(/\/inspections\/\d+\/edit$/);
    const inspectionId = Number(page.url().match(/inspections\/(\d+)\/edit/)![1]);

    // The readings go in through the same API the sheet saves with: last time's plus 0.03 mm,
    // and at ring 1's top position a reading past the wear limit, confirmed as checked.
    const { profile } = analysis;
    const dto = await (await page.request.get(`/api/inspections/${inspectionId}`)).json();
    const prev = (s: string, a: string) => analysis.latest?.cells.find((c) => c.stationKey === s && c.axisKey === a)?.correctedMm ?? profile.boreMm + 0.2;
    const worst = profile.stations.find((s) => s.role === "ring_tdc")!.key;
    const over = Math.round((profile.boreMm + profile.linerWearLimitMm + 0.3) * 100) / 100;
    const draft = {
      header: dto.draft.header,
      readings: profile.stations.flatMap((s) =>
        profile.axes.map((a, i) => {
          const isOver = s.key === worst && i === 0;
          return {
            stationKey: s.key,
            axisKey: a.key,
            diameterMm: isOver ? over : Math.round((prev(s.key, a.key) + 0.03) * 100) / 100,
            enteredUnit: "mm",
            warningConfirmed: isOver ? "Gauged twice: the liner is worn past its limit here." : null,
          };
        }),
      ),
      rings: profile.rings.map((r) => ({
        position: r.position,
        closedGapMm: Math.round(((r.gapNewMinMm + r.gapNewMaxMm) / 2 + 0.2) * 100) / 100,
        gapMeasuredIn: "gauge_ring",
        grooveClearanceMm: Math.round(((r.grooveNewMinMm + r.grooveNewMaxMm) / 2) * 100) / 100,
        renewed: false,
        condition: "Free in groove",
      })),
      checklist: {
        tally: [{ key: "tally_1", label: "Spanners and sockets", countIn: 12, countOut: 12 }],
        closing: { signedName: "Second Engineer", signedAt: new Date().toISOString() },
        rodNutPressureBar: 1250,
        stuffingBox: { done: true, note: null },
        cylinderLubrication: { done: true, note: null },
      },
    };
    const origin = new URL(baseURL!).origin;
    const saved = await page.request.put(`/api/inspections/${inspectionId}`, { headers: { origin }, data: { revision: dto.revision, draft } });
    expect(saved.status(), await saved.text()).toBe(200);
    await page.reload();
    await page.getByRole("button", { name: "Submit for approval" }).click();
    await expect(page).toHaveURL(new RegExp(`/inspections/${inspectionId}$`));

    // The chief's mail, with the record's link on this installation.
    const toChief = await mailTo(DEMO.chief, "Record to approve", `/inspections/${inspectionId}`);
    expect(toChief.text).toMatch(/cylinder 4/);
    const recordLink = new URL(/https?:\/\/\S+\/inspections\/\d+/.exec(toChief.text ?? "")![0]);
    expect(recordLink.origin).toBe(origin);

    const chief = await as(browser, DEMO.chief);
    await chief.page.goto(recordLink.pathname);
    await chief.page.getByRole("button", { name: "Approve…" }).click();
    await chief.page.getByRole("button", { name: "Approve this record" }).click();
    await expect(chief.page.getByTestId("inspection-state")).toContainText("Approved");
    await chief.context.close();

    const toSupt = await mailTo(DEMO.superintendent, "Over limit", `/units/${unitId}`);
    expect(toSupt.text).toMatch(/cylinder 4/);
    expect(toSupt.text).toMatch(/Largest wear \d+\.\d+ mm \(limit \d+\.\d+ mm\)/);
    const unitLink = new URL(/https?:\/\/\S+\/units\/\d+/.exec(toSupt.text ?? "")![0]);
    const supt = await as(browser, DEMO.superintendent);
    await supt.page.goto(unitLink.pathname);
    await expect(supt.page.getByRole("heading", { name: /Cylinder 4/ }).first()).toBeVisible();
    await expect(supt.page.getByText(/Over limit/).first()).toBeVisible();

    // The superintendent's notifications list the alert, sent, with a link to the unit.
    await supt.page.goto("/notifications");
    const item = supt.page.locator("li", { hasText: "Over limit" }).filter({ has: supt.page.locator(`a[href="/units/${unitId}"]`) }).first();
    await expect(item).toContainText("Sent");
    await supt.context.close();
  });

  test("an address that bounces is shown to the administrator, once, not retried", async ({ page }) => {
    const email = `bounce-${Date.now().toString(36)}@ship.invalid`;
    await signIn(page, DEMO.admin);
    await page.goto("/admin/users/invite");
    await page.getByLabel("Full name").fill("Bo Bounce");
    await page.getByLabel("E-mail address").fill(email);
    await page.getByLabel("Role").selectOption("engineer");
    await page.locator('input[name="vesselIds"]').first().check();
    await page.getByRole("button", { name: "Send invitation" }).click();
    await expect(page.getByText(`Invitation sent to ${email}.`)).toBeVisible();
    await expect
      .poll(async () => {
        await page.goto("/notifications?state=failed");
        return page.getByRole("region", { name: "Addresses that did not receive their e-mail" }).getByText(email, { exact: true }).count();
      }, { timeout: 20_000 })
      .toBe(1);
    await expect(page.getByText(/Bounced: the receiving server refuses this address/).first()).toBeVisible();
    await expect(page.locator("li", { hasText: email }).filter({ hasText: "Refused by the receiving mail server (bounced); not retried" })).toHaveCount(1);
  });

  for (const [label, width, height] of [["phone", 390, 844], ["tablet", 820, 1180], ["desk", 1440, 900]] as const) {
    test(`notifications, preferences and the undelivered list fit the screen (${label})`, async ({ browser }) => {
      const supt = await as(browser, DEMO.superintendent, { width, height });
      await supt.page.goto("/notifications");
      await expect(supt.page.getByRole("heading", { name: "Notifications" })).toBeVisible();
      await noSidewaysScroll(supt.page);
      await shot(supt.page, `notifications-list-${label}`);

      await supt.page.getByRole("link", { name: "Choose your e-mails" }).click();
      await expect(supt.page.getByRole("heading", { name: "Your e-mails" })).toBeVisible();
      const box = await supt.page.getByLabel("Weekly digest").boundingBox();
      const row = await supt.page.locator("label", { hasText: "Weekly digest" }).boundingBox();
      expect(box).not.toBeNull();
      expect(row!.height).toBeGreaterThanOrEqual(44);
      await noSidewaysScroll(supt.page);
      await shot(supt.page, `notifications-preferences-${label}`);
      // Switching the digest off, then on again, is saved and said.
      await supt.page.getByLabel("Weekly digest").uncheck();
      await supt.page.getByRole("button", { name: "Save my choices" }).click();
      await expect(supt.page.getByRole("status")).toContainText("Saved.");
      await supt.page.reload();
      await expect(supt.page.getByLabel("Weekly digest")).not.toBeChecked();
      await supt.page.getByLabel("Weekly digest").check();
      await supt.page.getByRole("button", { name: "Save my choices" }).click();
      await expect(supt.page.getByRole("status")).toContainText("weekly digest");
      await supt.context.close();

      const admin = await as(browser, DEMO.admin, { width, height });
      await admin.page.goto("/notifications?state=failed");
      await expect(admin.page.getByRole("heading", { name: "Notifications" })).toBeVisible();
      await noSidewaysScroll(admin.page);
      await shot(admin.page, `notifications-admin-failed-${label}`);
      await admin.context.close();
    });
  }
});
