import { beforeAll, describe, expect, it, vi } from "vitest";
import { asCaller, mockedCookies, mockedHeaders } from "../support/next-mocks";

vi.mock("next/headers", () => ({ headers: async () => mockedHeaders(), cookies: async () => mockedCookies() }));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn(), updateTag: vi.fn(), refresh: vi.fn() }));

import { saveCompanySettingsAction } from "@/lib/admin/actions";
import { getCompanySettings, getVesselCompanySettings } from "@/lib/company/settings";
import { db } from "@/lib/db/knex";
import { buildRoleWorld, WORLD_PASSWORD, type RoleWorld } from "../support/role-world";
import { signInCookie } from "../support/sessions";

let world: RoleWorld;
let adminCookie: string;
let suptCookie: string;

beforeAll(async () => {
  world = await buildRoleWorld(db, "company-settings");
  adminCookie = await signInCookie(world.users.admin.email, WORLD_PASSWORD);
  suptCookie = await signInCookie(world.users.supt.email, WORLD_PASSWORD);
});

describe("company settings", () => {
  it("a new company starts with the defaults", async () => {
    const s = await getCompanySettings(world.companyId);
    expect(s).toMatchObject({ companyId: world.companyId });
    expect(s!.currencyCode).toMatch(/^[A-Z]{3}$/);
    expect(s!.alertProbability).toBeGreaterThan(0);
    expect(s!.alertProbability).toBeLessThan(1);
  });

  it("the administrator saves them; the threshold is stored as a fraction; the change is audited", async () => {
    asCaller(adminCookie);
    const r = await saveCompanySettingsAction(undefined, { companyId: world.companyId, currencyCode: "nok", alertHorizonDays: "120", alertPercent: "35" });
    expect(r.ok).toBe(true);
    expect(await getCompanySettings(world.companyId)).toMatchObject({ currencyCode: "NOK", alertHorizonDays: 120, alertProbability: 0.35 });
    // A vessel's settings are its managing company's (worlds built under other tags may share vessels).
    const { company_id } = await db("vessels").where({ id: world.vessel1 }).first("company_id");
    expect((await getVesselCompanySettings(world.vessel1))!.companyId).toBe(company_id);
    const audit = await db("audit_log").where({ action: "company.settings", entity_id: String(world.companyId) }).orderBy("id", "desc").first("detail");
    expect(JSON.stringify(audit.detail)).toContain("0.35");
  });

  it("a value out of range is refused with its field named, and nothing changes", async () => {
    asCaller(adminCookie);
    const before = await getCompanySettings(world.companyId);
    const r = await saveCompanySettingsAction(undefined, { companyId: world.companyId, currencyCode: "NOK", alertHorizonDays: "5000", alertPercent: "35" });
    expect(r.ok).toBe(false);
    expect(Object.keys(r.fieldErrors)).toEqual(["alertHorizonDays"]);
    expect(r.values).toMatchObject({ alertHorizonDays: "5000" });
    expect(await getCompanySettings(world.companyId)).toEqual(before);
  });

  it("a superintendent may not change them", async () => {
    asCaller(suptCookie);
    const r = await saveCompanySettingsAction(undefined, { companyId: world.companyId, currencyCode: "EUR", alertHorizonDays: "60", alertPercent: "10" });
    expect(r.ok).toBe(false);
    expect((await getCompanySettings(world.companyId))!.currencyCode).not.toBe("EUR");
  });

  it("an unknown company is refused as not found", async () => {
    asCaller(adminCookie);
    const r = await saveCompanySettingsAction(undefined, { companyId: 99999999, currencyCode: "EUR", alertHorizonDays: "60", alertPercent: "10" });
    expect(r.ok).toBe(false);
    expect(r.code).toBe("not_found");
  });
});
