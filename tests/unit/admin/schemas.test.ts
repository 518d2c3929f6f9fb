import { describe, expect, it } from "vitest";
import { inviteUserSchema, profileSchema, vesselSchema, type ProfileInput } from "@/lib/admin/schemas";

const good: ProfileInput = {
  name: "Test profile",
  designation: "T-600",
  boreMm: 600,
  strokeMm: 2330,
  linerWearLimitMm: 3.6,
  ovalityLimitMm: 1.2,
  wearReference: "nominal",
  temperatureCorrection: true,
  linerMaterial: "Grey cast iron",
  alphaLinerPpmPerK: 10.5,
  gaugeMaterial: "Carbon steel",
  alphaGaugePpmPerK: 11.5,
  runningInHours: 3000,
  minPointsForProjection: 3,
  axisAKey: "fa",
  axisALabel: "Fore–aft",
  axisBKey: "ath",
  axisBLabel: "Athwartships",
  overhaulIntervalHours: 16000,
  rodNutPressureBar: 1500,
  notes: null,
  stations: [
    { key: "s1", label: "Top", depthMm: 40, role: "unworn_top" },
    { key: "s2", label: "TDC", depthMm: 120, role: "ring_tdc" },
    { key: "s3", label: "Mid", depthMm: 600, role: "intermediate" },
  ],
  rings: [{ label: "Ring 1", gapNewMinMm: 3.2, gapNewMaxMm: 3.8, gapLimitMm: 6.5, grooveNewMinMm: 0.4, grooveNewMaxMm: 0.5, grooveLimitMm: 0.9 }],
};

type Stations = ProfileInput["stations"];
type Rings = ProfileInput["rings"];

function paths(input: ProfileInput): string[] {
  const r = profileSchema.safeParse(input);
  return r.success ? [] : r.error.issues.map((i) => i.path.join("."));
}

describe("profileSchema", () => {
  it("accepts a consistent profile and keeps α in 10⁻⁶/K", () => {
    const r = profileSchema.parse({ ...good, boreMm: "600", linerWearLimitMm: "3,6" });
    expect(r.boreMm).toBe(600);
    expect(r.linerWearLimitMm).toBe(3.6);
  });

  it.each([
    ["wear limit 0", { linerWearLimitMm: 0 }, "linerWearLimitMm"],
    ["wear limit above 2 % of bore", { linerWearLimitMm: 12.5 }, "linerWearLimitMm"],
    ["ovality limit above the wear limit", { ovalityLimitMm: 4 }, "ovalityLimitMm"],
    ["same axis keys", { axisBKey: "FA" }, "axisBKey"],
    ["empty bore", { boreMm: "" }, "boreMm"],
  ] as const)("refuses %s, naming the field", (_label, change, field) => {
    expect(paths({ ...good, ...change } as ProfileInput)).toContain(field);
  });

  it("refuses stations out of depth order at the station that breaks it", () => {
    const stations = (good.stations as Stations).map((s, i) => (i === 2 ? { ...s, depthMm: 100 } : s));
    expect(paths({ ...good, stations })).toEqual(["stations.2.depthMm"]);
  });

  it("refuses duplicate station keys at the second one", () => {
    const stations = (good.stations as Stations).map((s, i) => (i === 2 ? { ...s, key: "S1" } : s));
    expect(paths({ ...good, stations })).toEqual(["stations.2.key"]);
  });

  it("needs at least one ring-at-TDC station, and accepts several", () => {
    const none = (good.stations as Stations).map((s) => ({ ...s, role: "intermediate" as const }));
    expect(paths({ ...good, stations: none })).toEqual(["stations"]);
    const two = (good.stations as Stations).map((s, i) => (i === 2 ? { ...s, role: "ring_tdc" as const } : s));
    expect(paths({ ...good, stations: two })).toEqual([]);
  });

  it.each([
    ["gap limit below the new maximum", { gapLimitMm: 3.5 }, "rings.0.gapLimitMm"],
    ["gap limit equal to the new maximum", { gapLimitMm: 3.8 }, "rings.0.gapLimitMm"],
    ["groove limit below the new maximum", { grooveLimitMm: 0.45 }, "rings.0.grooveLimitMm"],
    ["gap new max below new min", { gapNewMaxMm: 3.0 }, "rings.0.gapNewMaxMm"],
  ] as const)("refuses a ring whose %s", (_l, change, field) => {
    const rings = (good.rings as Rings).map((r) => ({ ...r, ...change }));
    expect(paths({ ...good, rings })).toEqual([field]);
  });
});

describe("vesselSchema", () => {
  const v = { name: "Test Petrel", imoNumber: "3104522", companyId: "1", newCompanyName: "", vesselType: "", flag: "", builtYear: "" };
  // 3104522 is invented (first digit 1–4, a block not issued to ships [memory]); check digit [derived]
  // under IMO Resolution A.1078(28).
  it("accepts a valid IMO number written with the prefix and stores the digits", () => {
    expect(vesselSchema.parse({ ...v, imoNumber: "IMO 3104522" }).imoNumber).toBe("3104522");
  });
  it("still accepts a number from the block issued to real ships (the scheme's worked example, 9074729 [memory])", () => {
    expect(vesselSchema.parse({ ...v, imoNumber: "9074729" }).imoNumber).toBe("9074729");
  });
  it("refuses a wrong check digit on the IMO field", () => {
    const r = vesselSchema.safeParse({ ...v, imoNumber: "3104523" });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].path).toEqual(["imoNumber"]);
  });
  it("needs a company or a new company name", () => {
    const r = vesselSchema.safeParse({ ...v, companyId: "" });
    expect(r.error?.issues[0].path).toEqual(["companyId"]);
  });
});

describe("inviteUserSchema", () => {
  it("needs a vessel for ship and office roles but not for admins", () => {
    expect(inviteUserSchema.safeParse({ name: "Pat Person", email: "Pat@Example.Test", role: "engineer", vesselIds: undefined }).success).toBe(false);
    const admin = inviteUserSchema.parse({ name: "Pat Person", email: "Pat@Example.Test", role: "admin", vesselIds: undefined });
    expect(admin).toMatchObject({ email: "pat@example.test", vesselIds: [] });
  });
  it("accepts one checkbox value as a list", () => {
    expect(inviteUserSchema.parse({ name: "Pat Person", email: "p@e.test", role: "engineer", vesselIds: "3" }).vesselIds).toEqual([3]);
  });
});
