import type { ChecklistInput } from "./schemas";

/*
 * The inspection's plain values — limits, states, labels, an empty checklist — with no
 * validator attached, for the browser screens; the zod schemas (./schemas) build on them
 * and re-export them for the server.
 */

/** Largest photo accepted (the file as stored, after upload). */
export const PHOTO_MAX_BYTES = 15 * 1024 * 1024;

export const PHOTO_TYPES = ["image/jpeg", "image/png", "image/webp", "image/heic", "image/heif"] as const;

export const GAP_MEASURED_IN = ["gauge_ring", "liner_unworn", "liner_worn"] as const;
export const GAP_MEASURED_IN_LABELS: Record<(typeof GAP_MEASURED_IN)[number], string> = {
  gauge_ring: "Gauge ring",
  liner_unworn: "Unworn liner",
  liner_worn: "Worn liner",
};

export const emptyChecklist = (): ChecklistInput => ({
  tally: [],
  closing: { signedName: null, signedAt: null },
  rodNutPressureBar: null,
  stuffingBox: { done: false, note: null },
  cylinderLubrication: { done: false, note: null },
});

export const INSPECTION_STATES = ["draft", "submitted", "returned", "approved", "superseded"] as const;
export type InspectionState = (typeof INSPECTION_STATES)[number];

export const STATE_LABELS: Record<InspectionState, string> = {
  draft: "Draft",
  submitted: "Awaiting approval",
  returned: "Returned for correction",
  approved: "Approved",
  superseded: "Superseded by amendment",
};
