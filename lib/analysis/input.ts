import { analyseInspection, type InspectionAnalysis } from "@/lib/wear/inspection";
import { asFittedGauging, correctedAsFittedReadings } from "@/lib/wear/as-fitted";
import type { Inspection, LinerReading, WearProfile } from "@/lib/wear/types";

/*
 * The analysis input of one inspection, built in one place for every caller: the gauging
 * sheet as it is typed, the inspection record (this gauging and the previous one), the
 * approval's audit entry and the unit loader. Pure, so the browser runs it too.
 */

/** The header fields the analysis reads, as the sheet and the record hold them. */
export type GaugingHeader = {
  inspectedOn: string;
  engineHours: number;
  linerHours: number;
  gaugeTempC: number | null;
  linerTempC: number | null;
};

export type InspectionAnalysisInput = {
  profile: WearProfile;
  inspection: Inspection;
  /** Corrected to 20 °C; undefined when the profile measures wear from the nominal bore. */
  asFittedReadings: LinerReading[] | undefined;
};

/** A gauging as the wear computations take it, from an id, a header and its readings. */
export function toGauging(id: string | number, header: GaugingHeader, readings: LinerReading[]): Inspection {
  // The readings are shared, not copied: the loader runs this for every gauging of the fleet.
  return {
    id: String(id),
    date: header.inspectedOn,
    engineHours: header.engineHours,
    linerHours: header.linerHours,
    gaugeTempC: header.gaugeTempC,
    linerTempC: header.linerTempC,
    readings,
  };
}

/**
 * Builds the input for analysing one gauging. `earliestOther` is the liner's earliest approved
 * gauging other than this one and the version it amends (the inspection context carries it);
 * the as-fitted rule then chooses between it and this gauging.
 */
export function inspectionAnalysisInput(
  profile: WearProfile,
  gauging: Inspection,
  earliestOther: Inspection | null | undefined,
): InspectionAnalysisInput {
  if (profile.wearReference !== "as_fitted") return { profile, inspection: gauging, asFittedReadings: undefined };
  const reference = asFittedGauging([gauging, earliestOther]);
  return { profile, inspection: gauging, asFittedReadings: reference ? correctedAsFittedReadings(profile, reference) : undefined };
}

/** Wear, ovality and their maxima for one gauging, from the one input builder. */
export function analyseGauging(profile: WearProfile, gauging: Inspection, earliestOther: Inspection | null | undefined): InspectionAnalysis {
  const input = inspectionAnalysisInput(profile, gauging, earliestOther);
  return analyseInspection(input.profile, input.inspection, input.asFittedReadings);
}
