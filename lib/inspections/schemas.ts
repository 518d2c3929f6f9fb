import { z } from "zod";
import { MAX_RUNNING_HOURS } from "@/lib/validation/bounds";
import { recordDate, recordDateTime } from "@/lib/validation/dates";
import { recordIdField } from "@/lib/validation/ids";
import { GAP_MEASURED_IN, INSPECTION_STATES, PHOTO_MAX_BYTES, type InspectionState } from "./constants";

// The plain values live in ./constants (no zod), so screens that only need a label or a limit
// do not carry the validator in their first load; they are re-exported here for the server.
export { emptyChecklist, GAP_MEASURED_IN, GAP_MEASURED_IN_LABELS, INSPECTION_STATES, PHOTO_MAX_BYTES, PHOTO_TYPES, STATE_LABELS, type InspectionState } from "./constants";

/*
 * One overhaul inspection as the browser and the server both see it. The entry form
 * validates with these schemas before every save, and the route handlers parse the
 * same schemas again, so the server refuses whatever a client let through. No server
 * imports here.
 */

/** Most a request may carry: far more than any profile (about 12 stations × 2 axes, 6 rings). */
export const LIMITS = { readings: 200, rings: 20, tallyItems: 40 } as const;


const numberError = (label: string) => (issue: { input?: unknown }) =>
  issue.input === undefined || issue.input === null ? `Enter the ${label}.` : `The ${label} must be a number, not "${String(issue.input).slice(0, 20)}".`;

/** A finite number with a range, and messages that name the field and quote what was sent. */
const num = (label: string, min: number, max: number, unit: string) =>
  z
    .number({ error: numberError(label) })
    .min(min, { error: (i) => `The ${label} cannot be below ${min} ${unit}; ${String(i.input)} ${unit} was entered.` })
    .max(max, { error: (i) => `The ${label} cannot be above ${max} ${unit}; ${String(i.input)} ${unit} was entered.` });

const optionalText = (label: string, max: number) =>
  z
    .string({ error: `The ${label} must be text.` })
    .trim()
    .max(max, `The ${label} is at most ${max} characters.`)
    .nullable()
    .transform((v) => (v === "" ? null : v));

/** The day of the inspection: a real calendar day from 1950 to today (lib/validation/dates.ts). */
export const isoDateSchema = recordDate("inspection date");

const temperature = (label: string) => num(label, -30, 150, "°C").nullable();

// ── header ───────────────────────────────────────────────────────────────────────

export const inspectionHeaderSchema = z.object({
  inspectedOn: isoDateSchema,
  engineHours: num("engine running hours", 0, MAX_RUNNING_HOURS, "h"),
  linerHours: num("liner hours", 0, MAX_RUNNING_HOURS, "h"),
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


export const ringReadingSchema = z.object({
  position: z.number({ error: "Name the ring position." }).int().min(1).max(LIMITS.rings),
  closedGapMm: num("closed gap", 0, 100, "mm").nullable(),
  /** No default: null until the engineer says, and required once a gap is entered. */
  gapMeasuredIn: z.enum(GAP_MEASURED_IN, { error: "Say where the gap was measured." }).nullable(),
  /** The liner's diameter where a gap was measured in a worn part of the liner. */
  gapLinerDiameterMm: num("liner diameter where the gap was measured", 1, 5000, "mm").nullable().optional(),
  grooveClearanceMm: num("groove clearance", 0, 20, "mm").nullable(),
  renewed: z.boolean({ error: "Say whether the ring was renewed." }),
  condition: optionalText("ring condition", 500),
});
export type RingReadingInput = z.infer<typeof ringReadingSchema>;

// ── overhaul checklist ───────────────────────────────────────────────────────────

const count = (label: string) =>
  z
    .number({ error: numberError(label) })
    .int({ error: (i) => `The ${label} is a whole number, not ${String(i.input)}.` })
    .min(0, { error: (i) => `The ${label} cannot be below 0; ${String(i.input)} was entered.` })
    .max(999, { error: (i) => `The ${label} is at most 999 items; ${String(i.input)} was entered.` })
    .nullable();

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
    signedAt: recordDateTime("time of the closing inspection").nullable(),
  }),
  rodNutPressureBar: num("rod nut tightening pressure", 0, 3000, "bar").nullable(),
  stuffingBox: checkItem,
  cylinderLubrication: checkItem,
});
export type ChecklistInput = z.infer<typeof checklistSchema>;


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

/** The record's revision counter as the client last saw it: 1, 2, 3… */
const revisionField = z
  .number({ error: (i) => (i.input == null ? "The revision is missing." : `The revision must be a number, not "${String(i.input).slice(0, 20)}".`) })
  // The range first: 1e20 is "no such revision", not "not a whole number".
  .min(1, { error: (i) => `The revision counts from 1; ${String(i.input)} was sent.` })
  .max(2_147_483_647, { error: (i) => `No record has revision ${String(i.input)}; reload the record.` })
  .int({ error: (i) => `The revision is a whole number, not ${String(i.input)}.` });

/** PUT /api/inspections/:id — a draft save; `revision` is the copy the client last had. */
export const saveDraftSchema = z.object({
  revision: revisionField,
  draft: inspectionDraftSchema,
  /**
   * A fresh id per save attempt, from the device. The server keeps the last accepted one, so
   * a device whose answer was lost recognises its own save in the 409 that follows.
   */
  saveId: z.string().regex(/^[A-Za-z0-9_-]{16,64}$/, "The save id is malformed.").optional(),
});
export type SaveDraftInput = z.infer<typeof saveDraftSchema>;

/** What the first screen asks before the grid opens. */
export const newInspectionFormSchema = z.object({
  inspectedOn: isoDateSchema,
  engineHours: num("engine running hours", 0, MAX_RUNNING_HOURS, "h"),
  linerHours: num("liner hours", 0, MAX_RUNNING_HOURS, "h"),
  linerHoursReason: optionalText("reason for the liner hours", 255),
  crew: optionalText("crew", 255),
  gaugeTempC: temperature("gauge temperature"),
  linerTempC: temperature("liner temperature"),
});
export type NewInspectionFormInput = z.infer<typeof newInspectionFormSchema>;

/** POST /api/inspections — `clientToken` makes a repeated create (double tap, retry) return the same row. */
export const createInspectionSchema = newInspectionFormSchema.extend({
  unitId: recordIdField("unit"),
  clientToken: z.string().regex(/^[A-Za-z0-9_-]{16,64}$/, "The request token is malformed."),
});
export type CreateInspectionInput = z.infer<typeof createInspectionSchema>;

export const submitInspectionSchema = z.object({ revision: revisionField.optional() });

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


export const presignPhotoSchema = z.object({
  fileName: z.string().trim().min(1).max(255),
  contentType: z.string().max(120),
  sizeBytes: z
    .number({ error: "Give the size of the file in bytes." })
    .int({ error: (i) => `A file size is a whole number of bytes, not ${String(i.input)}.` })
    .positive("The file is empty.")
    .max(Number.MAX_SAFE_INTEGER, "The file size is not a real size."),
});

export const completePhotoSchema = z.object({
  fileId: recordIdField("upload"),
  caption: optionalText("caption", 500),
  stationKey: z.string().max(16).nullable(),
  ringPosition: z.number().int().min(1).max(LIMITS.rings).nullable(),
});

// ── what the server sends back ───────────────────────────────────────────────────


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
  /** The device's id of the save that made this revision (null when not saved from the sheet). */
  lastSaveId: string | null;
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
