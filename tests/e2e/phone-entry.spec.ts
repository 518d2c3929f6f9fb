import { expect, test, type Page } from "@playwright/test";
import sharp from "sharp";
import { shot, signIn } from "./helpers";

/*
 * The engineer's screens on a phone held in one hand (390 × 844 CSS px, touch): nothing
 * scrolls sideways, every control is a target of at least 44 × 44 CSS px (WCAG 2.2
 * success criterion 2.5.5, Target Size (Enhanced); links inside a sentence are exempt, as
 * that criterion exempts them), and the sheet has no text under 14 px. Also, on the sheet:
 * photos taken with no network wait on the device and upload when it returns, and a file
 * that is not a photo is refused in plain words.
 */

test.use({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true });

const ENGINEER = "engineer2@brisemer.example";

async function expectNoSidewaysScroll(page: Page, what: string) {
  const { scrollWidth, clientWidth } = await page.evaluate(() => ({ scrollWidth: document.documentElement.scrollWidth, clientWidth: document.documentElement.clientWidth }));
  expect.soft(scrollWidth, `${what} scrolls sideways (${scrollWidth} > ${clientWidth})`).toBeLessThanOrEqual(clientWidth);
}

/** Every visible control smaller than 44 × 44 CSS px, described; links inside running text are exempt. */
async function smallTargets(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const MIN = 44 - 0.5;
    const out: string[] = [];
    const controls = document.querySelectorAll<HTMLElement>(
      'a[href], button, select, textarea, summary, [role="button"], [role="radio"], input:not([type="hidden"])',
    );
    for (const el of controls) {
      const style = getComputedStyle(el);
      if (style.visibility === "hidden" || el.closest("[aria-hidden='true'], .sr-only, [hidden]")) continue;
      let rect = el.getBoundingClientRect();
      if (rect.width === 0 || rect.height === 0) continue;
      // A visually hidden input (a file input behind its label) is tapped through its label.
      if (rect.width <= 2 && rect.height <= 2) {
        const label = el.id ? document.querySelector<HTMLElement>(`label[for="${el.id}"]`) : null;
        if (!label) continue;
        rect = label.getBoundingClientRect();
      }
      // A checkbox or radio is tapped through the label around it.
      if (el instanceof HTMLInputElement && (el.type === "checkbox" || el.type === "radio")) {
        const label = el.closest("label");
        if (label) rect = label.getBoundingClientRect();
      }
      // A link inside a sentence: the inline exception of the success criterion.
      if (el.tagName === "A" && style.display === "inline") {
        const parentText = (el.parentElement?.textContent ?? "").trim();
        if (parentText.length > (el.textContent ?? "").trim().length + 3) continue;
      }
      if (rect.width < MIN || rect.height < MIN) {
        const name = (el.getAttribute("aria-label") || el.textContent || el.getAttribute("name") || el.id || el.tagName).trim().slice(0, 40);
        out.push(`${el.tagName.toLowerCase()} "${name}" ${Math.round(rect.width)}×${Math.round(rect.height)}`);
      }
    }
    return out;
  });
}

/** Visible text under 14 px inside `root`, as "text (size)". */
async function smallText(page: Page, root: string): Promise<string[]> {
  return page.evaluate((sel) => {
    const out: string[] = [];
    const base = document.querySelector(sel);
    if (!base) return ["(no such element: " + sel + ")"];
    const walker = document.createTreeWalker(base, NodeFilter.SHOW_TEXT);
    for (let n = walker.nextNode(); n; n = walker.nextNode()) {
      const text = (n.textContent ?? "").trim();
      const el = n.parentElement;
      if (!text || !el || el.closest(".sr-only, [aria-hidden='true'], option, optgroup")) continue;
      const r = el.getBoundingClientRect();
      if (r.width === 0 || r.height === 0 || getComputedStyle(el).visibility === "hidden") continue;
      const size = parseFloat(getComputedStyle(el).fontSize);
      if (size < 14 - 0.01) out.push(`${text.slice(0, 30)} (${size}px)`);
    }
    return [...new Set(out)];
  }, root);
}

async function checkScreen(page: Page, what: string) {
  await expect(page).toHaveTitle(/Kalibore/);
  await page.waitForLoadState("networkidle");
  await expectNoSidewaysScroll(page, what);
  expect.soft(await smallTargets(page), `${what}: targets under 44 × 44 px`).toEqual([]);
  await shot(page, `phone-${what.replace(/\W+/g, "-")}`);
}

/** The engineer's open draft from the home page (the demo gives engineer2 one). */
async function openDraftSheet(page: Page) {
  await page.goto("/");
  const href = await page.locator('section[aria-labelledby="drafts"] a[href^="/inspections/"]').first().getAttribute("href");
  expect(href, "the demo gives engineer2 an open draft").toMatch(/^\/inspections\/\d+$/);
  await page.goto(`${href}/edit`);
  await expect(page.locator("#cell-0-0")).toBeVisible();
  return Number(href!.split("/").pop());
}

test.describe("[ENGINEER][PHONE] entry screens at 390 px with touch", () => {
  test.describe.configure({ timeout: 180_000 });

  test("no screen scrolls sideways, every target is 44 px, the sheet's text is 14 px or more", async ({ page }) => {
    await signIn(page, ENGINEER);
    await checkScreen(page, "home");

    await page.goto("/inspections/new");
    await checkScreen(page, "unit chooser");
    // Every unit card keeps its "next overhaul" line inside the card.
    const spill = await page.evaluate(() =>
      [...document.querySelectorAll<HTMLElement>('main a[href*="unit="]')].filter((a) => [...a.querySelectorAll("span")].some((s) => s.getBoundingClientRect().right > a.getBoundingClientRect().right + 0.5)).length,
    );
    expect(spill, "unit cards with text spilling out").toBe(0);

    // A unit without an open draft shows the new-inspection form; one with a draft opens that draft.
    const units = await page.locator('main a[href*="unit="]').evaluateAll((as) => as.map((a) => a.getAttribute("href")!));
    let formShown = false;
    for (const href of units) {
      await page.goto(href);
      if (/unit=\d+/.test(page.url())) {
        formShown = true;
        break;
      }
      await expect(page.getByText(/already had an open draft/)).toBeVisible();
    }
    expect(formShown, "some unit of engineer2's vessel has no open draft").toBe(true);
    await checkScreen(page, "new inspection");

    // Enter in a header field moves to the next field and opens nothing.
    await page.getByLabel("Crew (who gauged)").fill("3/E");
    await page.getByLabel("Crew (who gauged)").press("Enter");
    await expect(page.getByLabel("Micrometer temperature")).toBeFocused();
    await page.getByLabel("Micrometer temperature").fill("20");
    await page.getByLabel("Micrometer temperature").press("Enter");
    await expect(page.getByLabel("Liner temperature")).toBeFocused();
    await expect(page).toHaveURL(/unit=\d+/);

    const draftId = await openDraftSheet(page);
    await checkScreen(page, "gauging sheet");
    expect.soft(await smallText(page, "main"), "text under 14 px on the sheet").toEqual([]);
    // The sticky bar leaves the phone's screen to the sheet.
    const bar = await page.getByTestId("sheet-toolbar").boundingBox();
    expect(bar!.height, "sticky bar height").toBeLessThanOrEqual(72);
    // Every section link is on screen.
    for (const name of ["Hours", "Liner", "Rings", "Checklist", "Photos", "Submit"]) {
      const box = await page.getByRole("navigation", { name: "Sections" }).getByRole("link", { name, exact: true }).boundingBox();
      expect(box && box.x >= 0 && box.x + box.width <= 390, `section link ${name} inside the screen`).toBe(true);
    }

    // The tool tally: a short count shows "still inside" on screen, beside the counts.
    const countsIn = page.getByLabel(/count taken in/);
    const countsOut = page.getByLabel(/count brought out/);
    await countsIn.first().fill("3");
    await countsOut.first().fill("2");
    const short = page.getByTestId("tally-short").first();
    await short.scrollIntoViewIfNeeded();
    await expect(short).toContainText("still inside");
    const box = await short.boundingBox();
    expect(box!.x + box!.width, "'still inside' within the 390 px screen").toBeLessThanOrEqual(390);
    await shot(page, "phone-tally-short");
    await expectNoSidewaysScroll(page, "gauging sheet with a short tally");

    await page.goto(`/inspections/${draftId}`);
    await checkScreen(page, "inspection record");
  });

  test("a photo taken with no network waits on the device and uploads when the network returns", async ({ page, context }) => {
    await signIn(page, ENGINEER);
    await openDraftSheet(page);
    const before = await page.locator("#photos li img").count();

    // A file that is not a photo: refused on the device, in words, with nothing technical.
    await page.locator("#photo-file").setInputFiles({ name: "notes.txt", mimeType: "text/plain", buffer: Buffer.from("s1,600.01\n") });
    const refusal = page.getByText(/“notes.txt” is not a photo/);
    await expect(refusal).toBeVisible();
    await expect(refusal).not.toContainText(/field:|text\/plain|contentType/);

    const png = await sharp({ create: { width: 320, height: 240, channels: 3, background: { r: 120, g: 90, b: 60 } } }).png().toBuffer();
    await context.setOffline(true);
    await page.locator("#photo-caption").fill("Taken with no network");
    await page.locator("#photo-file").setInputFiles({ name: "offline.png", mimeType: "image/png", buffer: png });
    const waiting = page.getByTestId("photos-waiting");
    await expect(waiting).toContainText("1 photo waiting for the network");
    await expect(waiting.getByRole("img")).toBeVisible();
    await shot(page, "phone-photo-waiting");
    // Kept on the device, not only in this page's memory.
    expect(
      await page.evaluate(
        () =>
          new Promise<number>((resolve) => {
            const open = indexedDB.open("kalibore-photos");
            open.onsuccess = () => {
              const req = open.result.transaction("waiting").objectStore("waiting").count();
              req.onsuccess = () => resolve(req.result);
            };
          }),
      ),
    ).toBe(1);

    await context.setOffline(false);
    await expect(waiting).toHaveCount(0, { timeout: 30_000 });
    await expect(page.getByText("Taken with no network").first()).toBeVisible();
    await expect(page.locator("#photos li img")).toHaveCount(before + 1, { timeout: 15_000 });
  });

  test("the offline copy of home says when it was taken", async ({ page, context }) => {
    await signIn(page, ENGINEER);
    await page.goto("/");
    await expect.poll(() => page.evaluate(() => navigator.serviceWorker?.controller != null), { timeout: 30_000 }).toBe(true);
    // Loaded once more under the worker, which keeps the copy as it passes.
    await page.reload();
    await expect
      .poll(() => page.evaluate(async () => (await caches.keys()).length > 0 && !!(await caches.match(location.origin + "/"))), { timeout: 30_000 })
      .toBe(true);
    await context.setOffline(true);
    await page.reload();
    await expect(page.getByTestId("page-time")).toContainText(/copy kept on this device at \d\d:\d\d on \d{1,2} \w{3}/);
    await shot(page, "phone-home-offline");
    await context.setOffline(false);
  });
});
