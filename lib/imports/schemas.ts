import { z } from "zod";
import { MAX_RUNNING_HOURS } from "@/lib/validation/bounds";
import { recordDate } from "@/lib/validation/dates";
import { recordIdField } from "@/lib/validation/ids";
import { IMPORT_FIELDS, IMPORT_MAX_BYTES } from "./layout";

/*
 * What the import screen sends, parsed again by the routes. No server imports.
 */

const mb = (n: number) => `${(n / (1024 * 1024)).toFixed(0)} MB`;

export const createUploadSchema = z.object({
  vesselId: recordIdField("vessel"),
  fileName: z.string({ error: "Name the file." }).trim().min(1, "Name the file.").max(255, "The file name is at most 255 characters."),
  sizeBytes: z
    .number({ error: "Give the file's size." })
    .int()
    .min(1, "The file is empty: choose the file with the readings.")
    .max(IMPORT_MAX_BYTES, { error: (i) => `The file is ${(Number(i.input) / (1024 * 1024)).toFixed(1)} MB; the importer takes files up to ${mb(IMPORT_MAX_BYTES)}. Split it by year or by unit.` }),
});
export type CreateUploadInput = z.infer<typeof createUploadSchema>;

const columnIndex = z.number().int().min(0).max(199);

export const columnMappingSchema = z
  .object(Object.fromEntries(IMPORT_FIELDS.map((f) => [f, columnIndex.optional()])) as Record<(typeof IMPORT_FIELDS)[number], z.ZodOptional<typeof columnIndex>>)
  .strict();

export const csvOptionsSchema = z.object({
  delimiter: z.enum([",", ";", "\t"], { error: "The delimiter must be a comma, a semicolon or a tab." }),
  decimalMark: z.enum([".", ","], { error: "The decimal mark must be a point or a comma." }),
  hasHeader: z.boolean(),
  lengthUnit: z.enum(["mm", "in"], { error: "Lengths are in mm or in." }),
});

export const newDraftSchema = z.object({
  inspectedOn: recordDate("inspection date"),
  engineHours: z.number({ error: "Enter the engine running hours." }).min(0).max(MAX_RUNNING_HOURS),
  linerHours: z.number().min(0).max(MAX_RUNNING_HOURS).nullable().optional(),
});

export const createImportSchema = z
  .object({
    fileId: recordIdField("uploaded file"),
    vesselId: recordIdField("vessel"),
    destination: z.enum(["draft", "history"], { error: "Choose where the readings go: a draft of one unit, or the history of an engine." }),
    engineId: recordIdField("engine").nullable().optional(),
    unitId: recordIdField("unit").nullable().optional(),
    /** An existing draft to fill; absent or null with `newDraft` for a new one. */
    inspectionId: recordIdField("draft").nullable().optional(),
    newDraft: newDraftSchema.nullable().optional(),
    mapping: columnMappingSchema,
    options: csvOptionsSchema,
    excludedLines: z.array(z.number().int().min(1)).max(20_000).default([]),
    replacesImportId: recordIdField("import to replace").nullable().optional(),
    saveMapping: z.boolean().default(true),
  })
  .superRefine((v, ctx) => {
    if (v.destination === "history" && !v.engineId) ctx.addIssue({ code: "custom", path: ["engineId"], message: "Choose the engine whose past records these are." });
    if (v.destination === "draft" && !v.unitId) ctx.addIssue({ code: "custom", path: ["unitId"], message: "Choose the unit the gauge file is for." });
    if (v.destination === "draft" && !v.inspectionId && !v.newDraft) ctx.addIssue({ code: "custom", path: ["newDraft"], message: "Choose the draft to fill, or give the date and engine hours of a new one." });
  });
export type CreateImportInput = z.infer<typeof createImportSchema>;

export const commitImportSchema = z.object({
  /** The importer read the warnings and confirms the values as read. */
  confirmWarnings: z.boolean().default(false),
  /** For a draft that already holds typed readings: replace them with the file's, or keep them. */
  typedReadings: z.enum(["replace", "keep"]).nullable().optional(),
});
export type CommitImportInput = z.infer<typeof commitImportSchema>;

export const IMPORT_STATUS_LABELS = {
  previewed: "Previewed, not imported",
  committed: "Imported",
  approved: "Imported and approved",
  superseded: "Replaced by a later import",
  discarded: "Previewed, then mapped again",
} as const;
export type ImportStatus = keyof typeof IMPORT_STATUS_LABELS;
