/**
 * The demo scenario generator (fixtures/demo). All of this data is INVENTED for the demo:
 * company, ships, IMO numbers, engine designs, serials and people.
 * Check values: IMO check digit rule [src] IMO Resolution A.1078(28); wear limit about
 * 0.6 % of bore, normal wear 0.025–0.05 mm/1000 h [src] BrightHub Engineering articles on
 * liner wear, abnormal above 0.1 mm/1000 h [src] marineengineeringonline.com report on
 * abnormal liner wear; temperature correction [derived]. Least squares from simple-statistics,
 * an independent reference library.
 */
import { linearRegression, linearRegressionLine, median, rSquared } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { parseImoNumber } from "@/lib/units/imo";
import { DEFAULT_SEED, buildScenario, collectScenario, vesselsOf, type CollectedScenario, type InspectionSeed, type ProfileSeed } from "@/fixtures/demo/scenario";
import { createRng } from "@/fixtures/demo/random";

describe("seeded random numbers", () => {
  it("repeats for a seed and differs between seeds", () => {
    const a = createRng(7);
    const b = createRng(7);
    const c = createRng(8);
    const xs = Array.from({ length: 5 }, () => a.next());
    expect(Array.from({ length: 5 }, () => b.next())).toEqual(xs);
    expect(Array.from({ length: 5 }, () => c.next())).not.toEqual(xs);
    const r = createRng(1);
    for (let i = 0; i < 1000; i++) {
      const k = r.int(2, 4);
      expect(k >= 2 && k <= 4 && Number.isInteger(k)).toBe(true);
    }
    const normals = Array.from({ length: 4000 }, () => r.normal(10, 2));
    const mean = normals.reduce((s, x) => s + x, 0) / normals.length;
    expect(Math.abs(mean - 10)).toBeLessThan(0.15);
  });
});

describe("demo scenario (invented data)", () => {
  const sc = collectScenario();
  it("is deterministic from its seed", () => {
    expect(collectScenario()).toEqual(sc);
    const other = collectScenario({ seed: 42 });
    expect(other.vessels.map((v) => v.imoNumber)).not.toEqual(sc.vessels.map((v) => v.imoNumber));
    expect(other.linerReadings.slice(0, 50)).not.toEqual(sc.linerReadings.slice(0, 50));
  });

  it("gives the first vessels the same records at every scale (streamed per vessel)", () => {
    const big = buildScenario({ scale: 3 });
    expect(big.vesselPlans).toHaveLength(15);
    const first = vesselsOf(big).next().value!;
    expect(first.inspections).toEqual(sc.inspections.filter((i) => i.unitKey.startsWith("v1/")));
  });

  // How fast the large fleet is generated is the benchmark's business (npm run bench), not a test's.
  it("generates a large fleet one vessel at a time", { timeout: 120_000 }, () => {
    const big = buildScenario({ scale: 50 });
    let readings = 0;
    for (const b of vesselsOf(big)) readings += b.linerReadings.length;
    expect(big.vesselPlans).toHaveLength(250);
    expect(readings).toBeGreaterThan(80_000);
  });
});

describe.each([DEFAULT_SEED, 7, 1234])("demo scenario, seed %i", (seed) => {
  const sc = collectScenario({ seed });

  const profileOfUnit = (s: CollectedScenario) => {
    const profiles = new Map(s.profiles.map((p) => [p.key, p]));
    const engines = new Map(s.engines.map((e) => [e.key, profiles.get(e.profileKey)!]));
    return new Map(s.units.map((u) => [u.key, engines.get(u.engineKey)!]));
  };
  const unitProfile = profileOfUnit(sc);
  const readingsBy = new Map<string, { stationKey: string; axisKey: string; diameterMm: number }[]>();
  for (const r of sc.linerReadings) readingsBy.set(r.inspectionKey, [...(readingsBy.get(r.inspectionKey) ?? []), r]);

  /** Max wear of one inspection, corrected to 20 °C: D20 = R·(1+αg(Tg−20))/(1+αl(Tl−20)) [derived]. */
  function maxWear(i: InspectionSeed, p: ProfileSeed): number {
    const f = (1 + p.alphaGaugePerK * (i.gaugeTempC - 20)) / (1 + p.alphaLinerPerK * (i.linerTempC - 20));
    return Math.max(...readingsBy.get(i.key)!.map((r) => r.diameterMm * f - p.boreMm));
  }

  /** A straight line by least squares (simple-statistics), with its R², residual sd and slope sd. */
  function fit(points: [number, number][]) {
    const { m, b } = linearRegression(points);
    const line = linearRegressionLine({ m, b });
    const n = points.length;
    const sse = points.reduce((s, [x, y]) => s + (y - line(x)) ** 2, 0);
    const mx = points.reduce((a, [x]) => a + x, 0) / n;
    const sxx = points.reduce((a, [x]) => a + (x - mx) ** 2, 0);
    const sd = Math.sqrt(sse / (n - 2));
    return { slope: m, rSquared: rSquared(points, line), residualSd: sd, slopeSd: sd / Math.sqrt(sxx), n };
  }
  const slope = (points: [number, number][]) => fit(points).slope;

  /** (liner hours / 1000, max wear) of a liner's non-draft gaugings past running-in and at or after `fromHours`. */
  function steadyPoints(linerKey: string, fromHours = 0): [number, number][] {
    const l = sc.liners.find((x) => x.key === linerKey)!;
    const p = unitProfile.get(l.unitKey)!;
    return sc.inspections
      .filter((i) => i.linerKey === linerKey && i.state !== "draft" && i.linerHours > p.runningInHours && i.linerHours >= fromHours)
      .map((i) => [i.linerHours / 1000, maxWear(i, p)] as [number, number]);
  }

  /** Steady wear rate (mm/1000 h) of each current liner, from its non-draft inspections after running-in and after any change of rate. */
  function currentLinerRates(): Map<string, number> {
    const out = new Map<string, number>();
    for (const l of sc.liners.filter((x) => x.removedOn === null)) {
      const pts = steadyPoints(l.key, l.modelRateChangesAtLinerHours.at(-1) ?? 0);
      if (pts.length >= 2) out.set(l.unitKey, slope(pts));
    }
    return out;
  }

  it("has valid, invented IMO numbers, unique", () => {
    const imos = sc.vessels.map((v) => v.imoNumber);
    expect(new Set(imos).size).toBe(imos.length);
    for (const imo of imos) {
      // Invented: first digit 1–4, a block not issued to ships (issued numbers start 5–9 [memory]).
      expect(imo).toMatch(/^[1-4]\d{6}$/);
      const weights = [7, 6, 5, 4, 3, 2];
      const sum = weights.reduce((s, w, i) => s + w * Number(imo[i]), 0);
      expect(sum % 10).toBe(Number(imo[6])); // IMO Resolution A.1078(28) [src]
      expect(parseImoNumber(imo).ok).toBe(true);
    }
  });

  it("has one company, at least 4 ships, 2 engine profiles and 6–8 cylinder engines", () => {
    expect(sc.company.name).toBeTruthy();
    expect(sc.vessels.length).toBeGreaterThanOrEqual(4);
    expect(sc.profiles).toHaveLength(2);
    for (const p of sc.profiles) {
      expect(p.stations.length).toBeGreaterThanOrEqual(8);
      expect(p.stations.length).toBeLessThanOrEqual(10);
      expect(p.stations[0].role).toBe("unworn_top");
      expect(p.stations.at(-1)!.role).toBe("unworn_bottom");
      const depths = p.stations.map((s) => s.depthMm);
      expect([...depths].sort((a, b) => a - b)).toEqual(depths);
      // wear limit about 0.6 % of bore [src]
      expect(p.linerWearLimitMm / p.boreMm).toBeGreaterThanOrEqual(0.004);
      expect(p.linerWearLimitMm / p.boreMm).toBeLessThanOrEqual(0.008);
      expect(p.rings).toHaveLength(p.ringCount);
    }
    for (const e of sc.engines) {
      expect(e.cylinderCount).toBeGreaterThanOrEqual(6);
      expect(e.cylinderCount).toBeLessThanOrEqual(8);
      expect(sc.units.filter((u) => u.engineKey === e.key)).toHaveLength(e.cylinderCount);
    }
  });

  it("has engine designs of its own, with ring figures of a plausible size", () => {
    // Groove (axial) clearance of a 720 mm bore: top ring new 0.50–0.58, maximum up to 1.00 mm;
    // lower rings new 0.45–0.53, maximum up to 0.95 mm [src] a maker's published clearance table.
    // The demo's figures are invented: near those, but not a copy of them.
    const table = { top: [0.5, 0.58, 1.0], lower: [0.45, 0.53, 0.95] };
    for (const p of sc.profiles) {
      // A long-stroke crosshead engine: stroke about 3.5–4.5 times the bore [memory].
      expect(p.strokeMm / p.boreMm).toBeGreaterThan(3.5);
      expect(p.strokeMm / p.boreMm).toBeLessThan(4.5);
      for (const r of p.rings) {
        const ref = r.position === 1 ? table.top : table.lower;
        const own = [r.grooveNewMinMm, r.grooveNewMaxMm, r.grooveLimitMm];
        own.forEach((v, i) => {
          expect(v / ref[i]).toBeGreaterThan(0.8);
          expect(v / ref[i]).toBeLessThan(1.25);
        });
        expect(own).not.toEqual(ref);
        // New closed gap roughly 0.3–0.5 % of the bore [memory].
        expect(r.gapNewMinMm / p.boreMm).toBeGreaterThanOrEqual(0.003);
        expect(r.gapNewMaxMm / p.boreMm).toBeLessThanOrEqual(0.005);
      }
    }
  });

  it("keeps running hours monotonic, every 14 days, and inspections consistent with them", () => {
    for (const e of sc.engines) {
      const log = sc.runningHours.filter((r) => r.engineKey === e.key);
      expect(log.at(-1)!.loggedOn).toBe(sc.today);
      for (let k = 1; k < log.length; k++) {
        expect(log[k].engineHours).toBeGreaterThanOrEqual(log[k - 1].engineHours);
        expect(Date.parse(log[k].loggedOn) - Date.parse(log[k - 1].loggedOn)).toBe(14 * 86_400_000);
        expect(log[k].engineHours - log[k - 1].engineHours).toBeLessThanOrEqual(14 * 24);
      }
      const years = (Date.parse(sc.today) - Date.parse(log[0].loggedOn)) / (365.25 * 86_400_000);
      expect(years).toBeGreaterThanOrEqual(3.9);
      expect(years).toBeLessThanOrEqual(10.1);
      const perYear = (log.at(-1)!.engineHours - log[0].engineHours) / years;
      expect(perYear).toBeGreaterThan(5500);
      expect(perYear).toBeLessThan(7400);
    }
    const liners = new Map(sc.liners.map((l) => [l.key, l]));
    for (const u of sc.units) {
      const ins = sc.inspections.filter((i) => i.unitKey === u.key);
      expect(ins.length).toBeGreaterThanOrEqual(2);
      expect(ins[0].linerHours).toBeGreaterThanOrEqual(2000); // running-in inspection
      expect(ins[0].linerHours).toBeLessThanOrEqual(3100);
      for (let k = 1; k < ins.length; k++) {
        expect(ins[k].engineHours).toBeGreaterThan(ins[k - 1].engineHours);
        expect(ins[k].inspectedOn > ins[k - 1].inspectedOn).toBe(true);
      }
      for (const i of ins) {
        const l = liners.get(i.linerKey)!;
        expect(i.linerHours).toBeCloseTo(i.engineHours - l.installedEngineHours + l.linerHoursAtInstall, 1);
        expect(i.inspectedOn <= sc.today).toBe(true);
      }
      const p = unitProfile.get(u.key)!;
      expect(u.nextOverhaulEngineHours).toBeCloseTo(ins.at(-1)!.engineHours + p.overhaulIntervalHours, 1);
    }
  });

  it("has diameters that are positive and near the bore, and current liners within limits", () => {
    for (const i of sc.inspections) {
      const p = unitProfile.get(i.unitKey)!;
      expect(Math.abs(i.linerTempC - i.gaugeTempC)).toBeLessThanOrEqual(3.05);
      for (const r of readingsBy.get(i.key)!) {
        expect(r.diameterMm).toBeGreaterThan(0);
        expect(r.diameterMm - p.boreMm).toBeGreaterThan(-0.1);
        expect(r.diameterMm - p.boreMm).toBeLessThan(p.linerWearLimitMm);
      }
      expect(maxWear(i, p)).toBeLessThan(p.linerWearLimitMm);
    }
  });

  it("has exactly one unit whose wear jumped after a lubrication fault, to an abnormal rate", () => {
    const changed = sc.liners.filter((l) => l.modelRateChangesAtLinerHours.length > 0);
    expect(changed.map((l) => l.unitKey)).toEqual([sc.specials.fastWearUnitKey]);
    const liner = changed[0];
    expect(liner.removedOn).toBeNull();
    const p = unitProfile.get(liner.unitKey)!;
    const fault = liner.modelRateChangesAtLinerHours[0];
    const ins = sc.inspections.filter((i) => i.linerKey === liner.key && i.state !== "draft");
    const before = ins.filter((i) => i.linerHours < fault);
    const after = ins.filter((i) => i.linerHours >= fault);
    // Normal wear first: a gauging past running-in before the fault, at a normal rate since the
    // running-in check (0.025–0.05 mm/1000 h [src] BrightHub Engineering; 0.06 allows for scatter).
    const lastBefore = before.at(-1)!;
    expect(lastBefore.linerHours).toBeGreaterThan(p.runningInHours);
    const normal = ((maxWear(lastBefore, p) - maxWear(before[0], p)) * 1000) / (lastBefore.linerHours - before[0].linerHours);
    expect(normal).toBeGreaterThan(0.02);
    expect(normal).toBeLessThan(0.06);
    // Then above 0.1 mm/1000 h, abnormal [src] marineengineeringonline.com, in the interval
    // across the fault and in the line through the gaugings since.
    const jump = ((maxWear(after[0], p) - maxWear(lastBefore, p)) * 1000) / (after[0].linerHours - lastBefore.linerHours);
    expect(jump).toBeGreaterThan(0.1);
    expect(after.length).toBeGreaterThanOrEqual(3);
    const since = currentLinerRates().get(liner.unitKey)!;
    expect(since).toBeGreaterThan(0.1);
    expect(since).toBeLessThan(0.2);
    expect(after[0].notes).toMatch(/lubricator quill/i);
    // Well on its way to the limit by now.
    expect(maxWear(ins.at(-1)!, p)).toBeGreaterThan(0.6 * p.linerWearLimitMm);
  });

  it("keeps every other current liner at a normal wear rate", () => {
    // Normal wear of slow-speed two-stroke liners: 0.025–0.05 mm/1000 h [src] BrightHub Engineering.
    // The fitted slope may stray from the model's rate by the scatter of a few gaugings (2 sd).
    let checked = 0;
    for (const l of sc.liners.filter((x) => x.removedOn === null && x.unitKey !== sc.specials.fastWearUnitKey)) {
      expect(l.modelWearRateMmPer1000h).toBeGreaterThanOrEqual(0.025);
      expect(l.modelWearRateMmPer1000h).toBeLessThanOrEqual(0.05);
      const pts = steadyPoints(l.key);
      if (pts.length < 3) continue;
      const f = fit(pts);
      expect(f.slope + 2 * f.slopeSd).toBeGreaterThanOrEqual(0.025);
      expect(f.slope - 2 * f.slopeSd).toBeLessThanOrEqual(0.05);
      checked++;
    }
    expect(checked).toBeGreaterThan(10);
  });

  it("has wear histories that scatter like real gaugings, not straight lines", () => {
    const fits = sc.liners
      .filter((l) => l.removedOn === null && l.unitKey !== sc.specials.fastWearUnitKey)
      .map((l) => steadyPoints(l.key))
      .filter((pts) => pts.length >= 4)
      .map(fit);
    expect(fits.length).toBeGreaterThanOrEqual(8);
    // No history is a perfect line, and the typical one does not print as R² 1.000.
    for (const f of fits) {
      expect(f.rSquared).toBeLessThan(0.99995);
      expect(f.residualSd).toBeGreaterThan(0.005);
    }
    expect(median(fits.map((f) => f.rSquared))).toBeLessThan(0.9995);
    // Residual sd of a few hundredths of a millimetre: inside micrometers on large bores repeat
    // to about ±0.02–0.03 mm, and no two overhaul intervals wear alike (common practice).
    const sd = median(fits.map((f) => f.residualSd));
    expect(sd).toBeGreaterThan(0.015);
    expect(sd).toBeLessThan(0.06);
    // The unworn bands scatter by about a hundredth about the as-fitted bore.
    const band = sc.liners.slice(0, 12).flatMap((l) => {
      const p = unitProfile.get(l.unitKey)!;
      const top = p.stations[0].key;
      return sc.inspections
        .filter((i) => i.linerKey === l.key && i.state !== "draft")
        .flatMap((i) => readingsBy.get(i.key)!.filter((r) => r.stationKey === top).map((r) => r.diameterMm - p.boreMm));
    });
    const m = band.reduce((a, x) => a + x, 0) / band.length;
    const bandSd = Math.sqrt(band.reduce((a, x) => a + (x - m) ** 2, 0) / (band.length - 1));
    expect(bandSd).toBeGreaterThan(0.004);
    expect(bandSd).toBeLessThan(0.03);
  });

  it("wears faster while running in than in the steady state", () => {
    // Fast during running-in, then roughly linear [src] BrightHub Engineering.
    let checked = 0;
    for (const l of sc.liners) {
      const p = unitProfile.get(l.unitKey)!;
      const first = sc.inspections.find((i) => i.linerKey === l.key)!;
      expect(first.linerHours).toBeLessThanOrEqual(p.runningInHours);
      const pts = steadyPoints(l.key);
      if (pts.length < 3 || l.modelRateChangesAtLinerHours.length) continue;
      const runningIn = (maxWear(first, p) * 1000) / first.linerHours;
      expect(runningIn).toBeGreaterThan(fit(pts).slope * 1.2);
      checked++;
    }
    expect(checked).toBeGreaterThan(10);
  });

  it("renews ring sets at some overhauls, not all, and always with a new liner", () => {
    const byInspection = new Map<string, typeof sc.ringReadings>();
    for (const r of sc.ringReadings) byInspection.set(r.inspectionKey, [...(byInspection.get(r.inspectionKey) ?? []), r]);
    const overhauls = sc.inspections.filter((i) => i.state !== "draft" && i.notes !== "Running-in inspection." && !/^Running-in/.test(i.notes ?? "") && byInspection.has(i.key));
    const renewedSet = overhauls.filter((i) => byInspection.get(i.key)!.every((r) => r.renewed));
    const share = renewedSet.length / overhauls.length;
    expect(share).toBeGreaterThan(0.25);
    expect(share).toBeLessThan(0.85);
    const removals = new Set(sc.liners.filter((l) => l.removedOn !== null).map((l) => l.key));
    for (const i of sc.inspections.filter((x) => removals.has(x.linerKey)).slice(-1)) expect(byInspection.get(i.key)!.every((r) => r.renewed)).toBe(true);
  });

  it("has units projected to reach the wear limit within about two years", () => {
    const rates = currentLinerRates();
    for (const key of sc.specials.nearLimitUnitKeys) {
      const p = unitProfile.get(key)!;
      const last = sc.inspections.filter((i) => i.unitKey === key && i.state !== "draft").at(-1)!;
      const hoursLeft = ((p.linerWearLimitMm - maxWear(last, p)) / rates.get(key)!) * 1000;
      const log = sc.runningHours.filter((r) => r.engineKey === sc.units.find((u) => u.key === key)!.engineKey);
      const hoursSinceLast = log.at(-1)!.engineHours - last.engineHours;
      expect(hoursLeft - hoursSinceLast).toBeGreaterThan(3000);
      expect(hoursLeft - hoursSinceLast).toBeLessThan(2.5 * 7200);
    }
    expect(sc.specials.nearLimitUnitKeys.length).toBeGreaterThanOrEqual(2);
  });

  it("has exactly one ring set over its closed-gap limit, at its unit's latest inspection", () => {
    const inspections = new Map(sc.inspections.map((i) => [i.key, i]));
    const over = sc.ringReadings.filter((r) => {
      const i = inspections.get(r.inspectionKey)!;
      return r.closedGapMm > unitProfile.get(i.unitKey)!.rings[r.ringPosition - 1].gapLimitMm;
    });
    expect(over).toHaveLength(1);
    const i = inspections.get(over[0].inspectionKey)!;
    expect(i.unitKey).toBe(sc.specials.ringOverLimitUnitKey);
    expect(sc.inspections.filter((x) => x.unitKey === i.unitKey).at(-1)!.key).toBe(i.key);
    for (const r of sc.ringReadings) {
      const p = unitProfile.get(inspections.get(r.inspectionKey)!.unitKey)!;
      expect(r.closedGapMm).toBeGreaterThanOrEqual(p.rings[r.ringPosition - 1].gapNewMinMm * 0.95);
      expect(r.grooveClearanceMm).toBeLessThan(p.rings[r.ringPosition - 1].grooveLimitMm);
    }
  });

  it("has exactly one renewed liner, with the new liner's own readings after it", () => {
    const removed = sc.liners.filter((l) => l.removedOn !== null);
    expect(removed).toHaveLength(1);
    const old = removed[0];
    expect(old.unitKey).toBe(sc.specials.renewedUnitKey);
    expect(old.removalReason).toBeTruthy();
    const successor = sc.liners.find((l) => l.unitKey === old.unitKey && l.key !== old.key)!;
    expect(successor.installedEngineHours).toBe(old.removedEngineHours);
    expect(successor.installedOn).toBe(old.removedOn);
    const ins = sc.inspections.filter((i) => i.unitKey === old.unitKey);
    const oldIns = ins.filter((i) => i.linerKey === old.key);
    const newIns = ins.filter((i) => i.linerKey === successor.key);
    expect(oldIns.at(-1)!.engineHours).toBe(old.removedEngineHours);
    expect(newIns.length).toBeGreaterThanOrEqual(3);
    expect(newIns[0].engineHours).toBeGreaterThan(old.removedEngineHours!);
    expect(newIns[0].linerHours).toBeLessThan(3100);
  });

  it("has one submitted and one draft latest inspection; the rest approved by the vessel's chief", () => {
    const submitted = sc.inspections.filter((i) => i.state === "submitted");
    const drafts = sc.inspections.filter((i) => i.state === "draft");
    expect(submitted.map((i) => i.unitKey)).toEqual([sc.specials.submittedUnitKey]);
    expect(drafts.map((i) => i.unitKey)).toEqual([sc.specials.draftUnitKey]);
    for (const i of [...submitted, ...drafts]) expect(sc.inspections.filter((x) => x.unitKey === i.unitKey).at(-1)).toBe(i);
    expect(drafts[0].submittedAt).toBeNull();
    expect(submitted[0].submittedByKey).toBeTruthy();
    const vesselOfUnit = (unitKey: string) => unitKey.split("/")[0];
    for (const i of sc.inspections.filter((x) => x.state === "approved")) {
      const chief = sc.users.find((u) => u.key === i.approvedByKey)!;
      expect(chief.role).toBe("chief_engineer");
      expect(chief.vesselKeys).toEqual([vesselOfUnit(i.unitKey)]);
      expect(sc.users.find((u) => u.key === i.submittedByKey)!.role).toBe("engineer");
      expect(i.approvedAt! >= i.submittedAt!).toBe(true);
      expect(i.source).toBe("demo");
    }
  });

  it("has the overhaul checklist on every unit's latest inspection", () => {
    for (const u of sc.units) {
      const last = sc.inspections.filter((i) => i.unitKey === u.key).at(-1)!;
      const items = new Map(sc.checklist.filter((c) => c.inspectionKey === last.key).map((c) => [c.itemKey, c]));
      expect([...items.keys()].sort()).toEqual(["closing_inspection", "cylinder_lubrication", "rod_nut_pressure", "stuffing_box", "tool_tally"]);
      if (last.state === "draft") continue;
      expect(items.get("tool_tally")!.countIn).toBe(items.get("tool_tally")!.countOut);
      expect(items.get("closing_inspection")!.signedName).toBeTruthy();
      const p = unitProfile.get(u.key)!;
      expect(Math.abs(items.get("rod_nut_pressure")!.valueNumber! - p.rodNutPressureBar)).toBeLessThanOrEqual(25);
      expect(items.get("rod_nut_pressure")!.valueUnit).toBe("bar");
    }
  });

  it("has the demo sign-ins with their roles and vessels", () => {
    const byEmail = new Map(sc.users.map((u) => [u.email, u]));
    const v1 = sc.vessels[0].key;
    const v2 = sc.vessels[1].key;
    expect(byEmail.get("admin@brisemer.example")!.role).toBe("admin");
    expect(byEmail.get("supt@brisemer.example")!.role).toBe("superintendent");
    expect(byEmail.get("supt@brisemer.example")!.vesselKeys).toEqual(sc.vessels.map((v) => v.key));
    expect(byEmail.get("chief@brisemer.example")).toMatchObject({ role: "chief_engineer", vesselKeys: [v1] });
    expect(byEmail.get("engineer@brisemer.example")).toMatchObject({ role: "engineer", vesselKeys: [v1] });
    expect(byEmail.get("chief2@brisemer.example")).toMatchObject({ role: "chief_engineer", vesselKeys: [v2] });
    expect(byEmail.get("engineer2@brisemer.example")).toMatchObject({ role: "engineer", vesselKeys: [v2] });
    expect(new Set(sc.users.map((u) => u.email)).size).toBe(sc.users.length);
    for (const u of sc.users) expect(u.email.endsWith("@brisemer.example")).toBe(true);
    expect(sc.demoPassword).toBe("Kalibore-demo-1");
  });

});
