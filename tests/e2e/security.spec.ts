import { expect, test, type Page } from "@playwright/test";
import { DEMO, shot, signIn } from "./helpers";

/*
 * What a browser sees of the request and header rules: the Content-Security-Policy and the
 * other security headers on every page, every main screen working with the policy on (no
 * violation reported, the service worker registered, charts drawn), and one HTTP 404 for
 * malformed ids, missing records and records on another vessel.
 */

/** Collects the browser's reports of anything the Content-Security-Policy blocked. */
function watchViolations(page: Page): string[] {
  const seen: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "error" && /Content Security Policy|Refused to/i.test(m.text())) seen.push(m.text());
  });
  return seen;
}

test.describe("[SECURITY] headers and the content security policy", () => {
  test("pages carry a nonce policy and the fixed security headers; the API carries its own", async ({ page }) => {
    const res = await page.goto("/sign-in");
    const h = res!.headers();
    const csp = h["content-security-policy"];
    expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]{16,}' 'strict-dynamic'/);
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("object-src 'none'");
    expect(csp).toContain("base-uri 'none'");
    expect(csp).not.toMatch(/script-src[^;]*'unsafe-inline'/);
    expect(csp).not.toMatch(/script-src[^;]*'unsafe-eval'/);
    expect(h["x-content-type-options"]).toBe("nosniff");
    expect(h["referrer-policy"]).toBe("same-origin");
    expect(h["permissions-policy"]).toContain("camera=()");
    // Served over plain http here: no HSTS (a browser would ignore it anyway).
    expect(h["strict-transport-security"]).toBeUndefined();
    // A fresh nonce for every answer.
    const again = (await page.goto("/sign-in"))!.headers()["content-security-policy"];
    expect(again).not.toBe(csp);
    // The nonce on the page's scripts is the one in the policy.
    const nonce = /'nonce-([^']+)'/.exec(again)![1];
    const scriptNonces = await page.locator("script[src]").evaluateAll((els) => els.map((e) => (e as HTMLScriptElement).nonce));
    expect(scriptNonces.length).toBeGreaterThan(0);
    expect(scriptNonces.every((n) => n === nonce)).toBe(true);
    const api = await page.request.get("/api/health");
    expect(api.headers()["content-security-policy"]).toBe("default-src 'none'; frame-ancestors 'none'; sandbox");
    expect(api.headers()["x-content-type-options"]).toBe("nosniff");
  });

  test("every main screen works with the policy on", async ({ page }) => {
    test.setTimeout(120_000);
    const violations = watchViolations(page);
    await signIn(page, DEMO.engineer);
    // Client code ran under the policy: the service worker was registered by the page.
    await expect.poll(() => page.evaluate(async () => !!(await navigator.serviceWorker.getRegistration())), { timeout: 15_000 }).toBe(true);
    await page.goto("/fleet");
    await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
    const me = await (await page.request.get("/api/me")).json();
    const vessels = (await (await page.request.get("/api/vessels")).json()).vessels as { id: number; engineId: number | null }[];
    const vessel = vessels.find((v) => v.engineId)!;
    await page.goto(`/vessels/${vessel.id}`);
    await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
    await page.goto(`/engines/${vessel.engineId}`);
    await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
    const units = (await (await page.request.get(`/api/engines/${vessel.engineId}/analysis`)).json()).units as { unitId: number }[];
    await page.goto(`/units/${units[0].unitId}`);
    // The charts (visx, drawn in the browser) are there.
    await expect(page.locator("svg").first()).toBeVisible();
    await shot(page, "security-unit-with-csp");
    await page.goto("/inspections/new");
    await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
    await page.goto(`/inspections/new?unit=${units[0].unitId}`);
    await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
    await page.goto("/");
    await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
    expect(me.role).toBe("engineer");
    expect(violations, violations.join("\n")).toEqual([]);
  });
});

test.describe("[SECURITY] not found is one answer", () => {
  test("malformed ids, missing records and records on another vessel answer 404 with the not-found page", async ({ page, browser }) => {
    test.setTimeout(120_000);
    // The whole fleet, to find a vessel the engineer is not assigned to.
    const supt = await browser.newContext();
    const suptPage = await supt.newPage();
    await signIn(suptPage, DEMO.superintendent);
    const all = (await (await suptPage.request.get("/api/vessels")).json()).vessels as { id: number; engineId: number | null }[];
    await supt.close();

    await signIn(page, DEMO.engineer);
    const mine = ((await (await page.request.get("/api/me")).json()).vessels as number[]) ?? [];
    const foreign = all.find((v) => !mine.includes(v.id) && v.engineId)!;
    expect(foreign, "a vessel the engineer is not on").toBeTruthy();

    const paths = [
      "/engines/abc",
      "/vessels/abc",
      "/engines/1e309",
      "/units/-1",
      "/inspections/007",
      "/inspections/abc/edit",
      "/engines/4294967295",
      "/vessels/99999999",
      `/vessels/${foreign.id}`,
      `/engines/${foreign.engineId}`,
      "/inspections/new?unit=abc",
    ];
    for (const p of paths) {
      const res = await page.goto(p);
      expect(res!.status(), p).toBe(404);
      await expect(page.getByRole("heading", { name: "Nothing here" }), p).toBeVisible();
    }
    // The API answers the same way.
    for (const p of [`/api/vessels/${foreign.id}`, "/api/vessels/abc", "/api/vessels/99999999", `/api/engines/${foreign.engineId}/analysis`, "/api/engines/1e309/analysis"]) {
      expect((await page.request.get(p)).status(), p).toBe(404);
    }
  });

  test("a state-changing call from another origin or as text is refused", async ({ page, baseURL }) => {
    await signIn(page, DEMO.engineer);
    const foreign = await page.request.post("/api/inspections", { headers: { origin: "http://evil.example", "content-type": "application/json" }, data: "{}" });
    expect(foreign.status()).toBe(403);
    const text = await page.request.post("/api/inspections", { headers: { origin: new URL(baseURL!).origin, "content-type": "text/plain" }, data: "{}" });
    expect(text.status()).toBe(415);
  });
});
