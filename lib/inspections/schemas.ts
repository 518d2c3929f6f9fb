import { z } from "zod";

/*
 * One overhaul inspection as the browser and the server both see it. The entry form
 * validates with these schemas before every save, and the route handlers parse the
 * same schemas again, so the server refuses whatever a client let through. No server
 * imports here.
 */

/** Most a request may carry: far more than any profile (about 12 stations × 2 axes, 6 rings). */
export const LIMITS = { readings: 200, rings: 20, tallyItems: 40 } as const;

/** Largest photo accepted (the file as stored, after upload). */
export const PHOTO_MAX_BYTES = 15 * 1024 * 1024;

const numberError = (label: string) => (issue: { input?: unknown }) =>
  issue.input === undefined || issue.input === null ? `Enter the ${label}.` : `The ${label} must be a number, not "${String(issue.input).slice(0, 20)}".`;

/** A finite number with a range, and messages that name the field in words. */
const num = (label: string, min: number, max: number, unit: string) =>
  z
    .number({ error: numberError(label) })
    .min(min, `The ${label} cannot be below ${min} ${unit}.`)
    .max(max, `The ${label} cannot be above ${max} ${unit}.`);

const optionalText = (label: string, max: number) =>
  z
    .string({ error: `The ${label} must be text.` })
    .trim()
    .max(max, `The ${label} is at most ${max} characters.`)
    .nullable()
    .transform((v) => (v === "" ? null : v));

export const isoDateSchema = z
  .string({ error: "Enter the date." })
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Enter the date as yyyy-mm-dd.")
  .refine((s) => {
    const ms = Date.parse(`${s}T00:00:00Z`);
    return Number.isFinite(ms) && new Date(ms).toISOString().slice(0, 10) === s;
  }, "That date does not exist.");

const temperature = (label: string) => num(label, -30, 150, "°C").nullable();

// ── header ───────────────────────────────────────────────────────────────────────

export const inspectionHeaderSchema = z.object({
  inspectedOn: isoDateSchema,
  engineHours: num("engine running hours", 0, 2_000_000, "h"),
  linerHours: num("liner hours", 0, 2_000_000, "h"),
  /** Required when the liner hours differ from the value derived from the liner's installation. */
  linerHoursReason: optionalText("reason for the liner hours", 255),
  crew: optionalText("crew", 255),
  gaugeTempC: temperature("gauge temperature"),
  linerTempC: temperature("liner temperature"),
  notes: optionalText("notes", 5000),
});
export type InspectionHeader = z.infer<typeof inspectionHeaderSchema>;

// ── readings ─────────────────────────────────────────────────────────────────────

export const LENGTH_UNITS = ["mm", "in"] as const;

export const linerReadingSchema = z.object({
  stationKey: z.string({ error: "Name the station." }).min(1, "Name the station.").max(16),
  axisKey: z.string({ error: "Name the direction." }).min(1, "Name the direction.").max(16),
  diameterMm: z
    .number({ error: numberError("diameter") })
    .positive("A diameter must be more than 0 mm.")
    .max(5000, "A diameter cannot be above 5000 mm."),
  enteredUnit: z.enum(LENGTH_UNITS, { error: "The unit must be mm or in." }),
  /** The plausibility warning the engineer read and confirmed for this value. */
  warningConfirmed: optionalText("confirmed warning", 255),
});
export type LinerReadingInput = z.infer<typeof linerReadingSchema>;

export const GAP_MEASURED_IN = ["gauge_ring", "liner_unworn", "liner_worn"] as const;
export const GAP_MEASURED_IN_LABELS: Record<(typeof GAP_MEASURED_IN)[number], string> = {
  gauge_ring: "Gauge ring",
  liner_unworn: "Unworn liner",
  liner_worn: "Worn liner",
};

export const ringReadingSchema = z.object({
  position: z.number({ error: "Name the ring position." }).int().min(1).max(LIMITS.rings),
  closedGapMm: num("closed gap", 0, 100, "mm").nullable(),
  gapMeasuredIn: z.enum(GAP_MEASURED_IN, { error: "Say where the gap was measured." }),
  /** The liner's diameter where a gap was measured in a worn part of the liner. */
  gapLinerDiameterMm: num("liner diameter where the gap was measured", 1, 5000, "mm").nullable().optional(),
  grooveClearanceMm: num("groove clearance", 0, 20, "mm").nullable(),
  renewed: z.boolean({ error: "Say whether the ring was renewed." }),
  condition: optionalText("ring condition", 500),
});
export type RingReadingInput = z.infer<typeof ringReadingSchema>;

// ── overhaul checklist ───────────────────────────────────────────────────────────

const count = (label: string) => z.number({ error: numberError(label) }).int(`The ${label} is a whole number.`).min(0).max(999).nullable();

export const tallyItemSchema = z.object({
  key: z.string().regex(/^[a-z0-9_]{1,48}$/, "Tally item keys are lower-case letters, digits and _."),
  label: z.string({ error: "Name the tool or item." }).trim().min(1, "Name the tool or item.").max(160, "At most 160 characters."),
  countIn: count("count taken in"),
  countOut: count("count brought out"),
});
export type TallyItem = z.infer<typeof tallyItemSchema>;

const checkItem = z.object({ done: z.boolean(), note: optionalText("note", 500) });

export const checklistSchema = z.object({
  tally: z.array(tallyItemSchema).max(LIMITS.tallyItems, `At most ${LIMITS.tallyItems} tally items.`),
  closing: z.object({
    signedName: optionalText("name of the person closing", 120),
    signedAt: z.iso.datetime({ offset: true, error: "Enter the time of the closing inspection." }).nullable(),
  }),
  rodNutPressureBar: num("rod nut tightening pressure", 0, 3000, "bar").nullable(),
  stuffingBox: checkItem,
  cylinderLubrication: checkItem,
});
export type ChecklistInput = z.infer<typeof checklistSchema>;

export const emptyChecklist = (): ChecklistInput => ({
  tally: [],
  closing: { signedName: null, signedAt: null },
  rodNutPressureBar: null,
  stuffingBox: { done: false, note: null },
  cylinderLubrication: { done: false, note: null },
});

// ── whole documents and requests ─────────────────────────────────────────────────

export const inspectionDraftSchema = z
  .object({
    header: inspectionHeaderSchema,
    readings: z.array(linerReadingSchema).max(LIMITS.readings, `At most ${LIMITS.readings} readings.`),
    rings: z.array(ringReadingSchema).max(LIMITS.rings),
    checklist: checklistSchema,
  })
  .superRefine((v, ctx) => {
    const cells = new Set<string>();
    v.readings.forEach((r, i) => {
      const k = `${r.stationKey}|${r.axisKey}`;
      if (cells.has(k)) ctx.addIssue({ code: "custom", path: ["readings", i], message: `Two readings for station ${r.stationKey}, ${r.axisKey}.` });
      cells.add(k);
    });
    const rings = new Set<number>();
    v.rings.forEach((r, i) => {
      if (rings.has(r.position)) ctx.addIssue({ code: "custom", path: ["rings", i], message: `Two entries for ring ${r.position}.` });
      rings.add(r.position);
    });
    const keys = new Set<string>();
    v.checklist.tally.forEach((t, i) => {
      if (keys.has(t.key)) ctx.addIssue({ code: "custom", path: ["checklist", "tally", i, "key"], message: "Two tally items share a key." });
      keys.add(t.key);
    });
  });
export type InspectionDraft = z.infer<typeof inspectionDraftSchema>;

/** PUT /api/inspections/:id — a draft save; `revision` is the copy the client last had. */
export const saveDraftSchema = z.object({
  revision: z.number({ error: "The revision is missing." }).int().positive(),
  draft: inspectionDraftSchema,
});
export type SaveDraftInput = z.infer<typeof saveDraftSchema>;

/** What the first screen asks before the grid opens. */
export const newInspectionFormSchema = z.object({
  inspectedOn: isoDateSchema,
  engineHours: num("engine running hours", 0, 2_000_000, "h"),
  linerHours: num("liner hours", 0, 2_000_000, "h"),
  linerHoursReason: optionalText("reason for the liner hours", 255),
  crew: optionalText("crew", 255),
  gaugeTempC: temperature("gauge temperature"),
  linerTempC: temperature("liner temperature"),
});
export type NewInspectionFormInput = z.infer<typeof newInspectionFormSchema>;

/** POST /api/inspections — `clientToken` makes a repeated create (double tap, retry) return the same row. */
export const createInspectionSchema = newInspectionFormSchema.extend({
  unitId: z.number({ error: "Choose the unit." }).int().positive(),
  clientToken: z.string().regex(/^[A-Za-z0-9_-]{16,64}$/, "The request token is malformed."),
});
export type CreateInspectionInput = z.infer<typeof createInspectionSchema>;

export const submitInspectionSchema = z.object({ revision: z.number().int().positive().optional() });

export const returnInspectionSchema = z.object({
  comment: z
    .string({ error: "Say what must be corrected." })
    .trim()
    .min(3, "Say what must be corrected.")
    .max(1000, "At most 1000 characters."),
});

export const amendInspectionSchema = z.object({
  reason: z
    .string({ error: "Give the reason for the amendment." })
    .trim()
    .min(5, "Give the reason for the amendment (at least 5 characters).")
    .max(500, "At most 500 characters."),
  clientToken: z.string().regex(/^[A-Za-z0-9_-]{16,64}$/, "The request token is malformed."),
});

export const PHOTO_TYPES = ["image/jpeg", "image/png", "image/webp", "image/heic", "image/heif"] as const;

export const presignPhotoSchema = z.object({
  fileName: z.string().trim().min(1).max(255),
  contentType: z.string().max(120),
  sizeBytes: z.number().int().positive("The file is empty."),
});

export const completePhotoSchema = z.object({
  fileId: z.number().int().positive(),
  caption: optionalText("caption", 500),
  stationKey: z.string().max(16).nullable(),
  ringPosition: z.number().int().min(1).max(LIMITS.rings).nullable(),
});

// ── what the server sends back ───────────────────────────────────────────────────

export const INSPECTION_STATES = ["draft", "submitted", "returned", "approved", "superseded"] as const;
export type InspectionState = (typeof INSPECTION_STATES)[number];

export const STATE_LABELS: Record<InspectionState, string> = {
  draft: "Draft",
  submitted: "Awaiting approval",
  returned: "Returned for correction",
  approved: "Approved",
  superseded: "Superseded by amendment",
};

export type PersonStamp = { id: string; name: string } | null;

export type PhotoDto = {
  id: number;
  caption: string | null;
  stationKey: string | null;
  ringPosition: number | null;
  contentType: string;
  sizeBytes: number;
  sha256: string | null;
  originalName: string | null;
  hasThumbnail: boolean;
  createdAt: string;
};

/** One inspection as GET /api/inspections/:id and a 409 conflict return it. */
export type InspectionDto = {
  id: number;
  unitId: number;
  linerId: number;
  vesselId: number;
  state: InspectionState;
  version: number;
  revision: number;
  supersedesId: number | null;
  supersededById: number | null;
  amendmentReason: string | null;
  returnComment: string | null;
  source: string;
  draft: InspectionDraft;
  createdBy: PersonStamp;
  submittedBy: PersonStamp;
  submittedAt: string | null;
  approvedBy: PersonStamp;
  approvedAt: string | null;
  createdAt: string;
  updatedAt: string;
  photos: PhotoDto[];
};

// Forms and routes turn zod issues into messages one way (lib/validation/issues.ts).
export { describeIssues } from "@/lib/validation/issues";
