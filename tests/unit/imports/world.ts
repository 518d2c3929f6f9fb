import { buildScenario } from "@/fixtures/demo/scenario";
import type { ContextProfile } from "@/lib/inspections/context";
import type { ImportContext } from "@/lib/imports/preview";

/** The demo's 640 mm design as the importer sees it (ids invented), six units with a liner each fitted on 2015-03-01. */
export function p640Context(o: { linerFittedOn?: string } = {}): ImportContext {
  const seed = buildScenario().profiles.find((p) => p.key === "p640")!;
  const profile: ContextProfile = {
    id: 1,
    name: seed.name,
    designation: seed.designation,
    boreMm: seed.boreMm,
    linerWearLimitMm: seed.linerWearLimitMm,
    ovalityLimitMm: seed.ovalityLimitMm,
    wearReference: seed.wearReference,
    temperatureCorrection: seed.temperatureCorrection,
    alphaLinerPerK: seed.alphaLinerPerK,
    alphaGaugePerK: seed.alphaGaugePerK,
    runningInHours: seed.runningInHours,
    minPointsForProjection: seed.minPointsForProjection,
    axes: seed.axes,
    stations: seed.stations.map((s, i) => ({ id: 100 + i, key: s.key, label: s.label, depthMm: s.depthMm, role: s.role })),
    rings: seed.rings.map((r) => ({ ...r })),
    rodNutPressureBar: seed.rodNutPressureBar,
  };
  return {
    engine: { id: 7, serial: "KB-640-6-TEST", vesselId: 3, vesselName: "Test vessel" },
    profile,
    units: [1, 2, 3, 4, 5, 6].map((n) => ({
      id: 10 + n,
      cylinderNo: n,
      liners: [{ id: 50 + n, serial: `L-${n}`, installedOn: o.linerFittedOn ?? "2015-03-01", installedEngineHours: 0, linerHoursAtInstall: 0, removedOn: null }],
    })),
    prior: [],
    existing: [],
    hoursLog: [],
  };
}
