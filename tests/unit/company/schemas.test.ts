import { describe, expect, it } from "vitest";
import { companySettingsSchema, isCurrencyCode } from "@/lib/company/schemas";

describe("company settings form", () => {
  // ISO 4217 (current list): USD, EUR, NOK, JPY are active codes; "EU" is too short; "ABC" is no code.
  it.each(["USD", "EUR", "NOK", "JPY"])("accepts the ISO 4217 code %s", (code) => {
    expect(isCurrencyCode(code)).toBe(true);
  });
  it.each(["EU", "EURO", "ABC", "usd", "", "€"])("refuses %j as a currency code", (code) => {
    expect(isCurrencyCode(code)).toBe(false);
  });

  it("takes typed strings, upper-cases the currency and keeps the threshold in per cent", () => {
    const v = companySettingsSchema.parse({ companyId: "3", currencyCode: " eur ", alertHorizonDays: "183", alertPercent: "20" });
    expect(v).toEqual({ companyId: 3, currencyCode: "EUR", alertHorizonDays: 183, alertPercent: 20 });
  });

  it.each([
    ["alertHorizonDays", { alertHorizonDays: "13" }, "at least 14"],
    ["alertHorizonDays", { alertHorizonDays: "4000" }, "at most 1095"],
    ["alertHorizonDays", { alertHorizonDays: "90.5" }, "whole number"],
    ["alertPercent", { alertPercent: "0" }, "at least 1"],
    ["alertPercent", { alertPercent: "100" }, "at most 99"],
    ["alertPercent", { alertPercent: "lots" }, "whole number"],
    ["currencyCode", { currencyCode: "XX1" }, "ISO 4217"],
  ])("names the field %s when it is out of range", (field, change, words) => {
    const r = companySettingsSchema.safeParse({ companyId: 1, currencyCode: "USD", alertHorizonDays: 183, alertPercent: 20, ...change });
    expect(r.success).toBe(false);
    const issue = r.error!.issues[0];
    expect(issue.path).toEqual([field]);
    expect(issue.message).toContain(words);
  });
});
